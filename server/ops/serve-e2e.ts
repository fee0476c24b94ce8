// The app as the end-to-end tests see it: the built client, the e2e database and its own fake inbox.
import { loadConfig } from '../config';
import { startFakeInbox } from '../mail/fake-inbox';
import { startServer, stopOnSignals } from '../main';

async function main(): Promise<void> {
  const cfg = loadConfig({ ...process.env, DATABASE_URL: process.env.E2E_DATABASE_URL });
  const inbox = await startFakeInbox(cfg.SMTP_PORT, cfg.MAIL_WEB_PORT);
  const app = await startServer(cfg);
  stopOnSignals(async () => {
    await app.stop();
    await inbox.stop();
  });
  console.log(`e2e server on ${app.url}`);
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
