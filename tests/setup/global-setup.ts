// Once per vitest run: the test database (migrated once) and the fake mail server on test ports.
import { loadConfig } from '#server/config';
import { startFakeInbox } from '#server/mail/fake-inbox';
import { migrate, prepareDatabase } from '#server/ops/database';
import { portIsFree } from '#server/ops/ports';

export const TEST_SMTP_PORT = 1926;
export const TEST_MAIL_WEB_PORT = 1981;

export default async function setup(): Promise<() => Promise<void>> {
  process.env.NODE_ENV = 'test';
  process.env.PG_DATABASE ??= 'crownwatch_test';
  const cfg = loadConfig();
  await prepareDatabase(cfg);
  await migrate(cfg.databaseUrl);
  process.env.DATABASE_URL = cfg.databaseUrl;
  process.env.SMTP_PORT = String(TEST_SMTP_PORT);
  process.env.MAIL_WEB_PORT = String(TEST_MAIL_WEB_PORT);
  const inbox = (await portIsFree(TEST_SMTP_PORT)) ? await startFakeInbox(TEST_SMTP_PORT, TEST_MAIL_WEB_PORT) : null;
  return async () => {
    await inbox?.stop();
  };
}
