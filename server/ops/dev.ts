// `npm run dev`: database, migrations, demo and fake inbox as for `npm start`, then the API with reload
// (tsx watch) and the client with hot reload (Vite on :5173, proxying /api to the API).
import { spawn } from 'node:child_process';
import { loadConfig } from '../config';
import { startFakeInbox } from '../mail/fake-inbox';
import { seedDemo } from '#seed/demo';
import { createLogger } from '../logger';
import { createMailer } from '../mail/mailer';
import { recomputeAll } from '../projections/projection.service';
import { migrate, prepareDatabase, withDataSource } from './database';
import { portIsFree } from './ports';

async function main(): Promise<void> {
  const cfg = loadConfig();
  await prepareDatabase(cfg);
  await migrate(cfg.databaseUrl);
  await withDataSource(cfg.databaseUrl, async (ds) => {
    const seeded = await seedDemo(ds, { bcryptCost: cfg.BCRYPT_COST });
    if (seeded.created) await recomputeAll({ ds, cfg, mailer: createMailer(cfg), log: createLogger('warn') }, { quiet: true });
  });
  const inbox = (await portIsFree(cfg.SMTP_PORT)) ? await startFakeInbox(cfg.SMTP_PORT, cfg.MAIL_WEB_PORT) : null;
  const children = [
    spawn('node_modules/.bin/tsx', ['watch', '--clear-screen=false', 'server/ops/serve-api.ts'], { stdio: 'inherit' }),
    spawn('node_modules/.bin/vite', [], { stdio: 'inherit' }),
  ];
  const stop = async (): Promise<void> => {
    for (const c of children) c.kill('SIGTERM');
    await inbox?.stop();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
  console.log(`Client with hot reload: http://127.0.0.1:5173 · API: ${cfg.publicUrl} · inbox: http://127.0.0.1:${cfg.MAIL_WEB_PORT}`);
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
