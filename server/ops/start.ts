// `npm start`: database, migrations, demo scenario, fake mail server, client build, then the app.
import { loadConfig } from '../config';
import { startFakeInbox } from '../mail/fake-inbox';
import { startServer, stopOnSignals } from '../main';
import { createLogger } from '../logger';
import { createMailer } from '../mail/mailer';
import { recomputeAll, unprojectedPieceIds } from '../projections/projection.service';
import { DEMO_PASSWORD, DEMO_USERS } from '#seed/designs';
import { seedDemo } from '#seed/demo';
import { migrate, prepareDatabase, withDataSource } from './database';
import { portIsFree } from './ports';
import { run } from './system';

async function main(): Promise<void> {
  process.env.NODE_ENV ??= 'development';
  const cfg = loadConfig();
  if (!(await portIsFree(cfg.PORT, cfg.HOST))) {
    throw new Error(`Port ${cfg.PORT} is already in use: Crownwatch (or another program) is already running there. Stop it, or set PORT to another port.`);
  }
  await prepareDatabase(cfg);
  const ran = await migrate(cfg.databaseUrl);
  if (ran.length) console.log(`Migrations applied: ${ran.join(', ')}`);
  const seeded = await withDataSource(cfg.databaseUrl, (ds) => seedDemo(ds, { bcryptCost: cfg.BCRYPT_COST }));
  console.log(seeded.created ? 'Demo scenario loaded.' : 'Demo scenario already present.');
  // Pieces never projected (a new demo, or a database from before projections) get theirs now, quietly;
  // after that the queue keeps them current.
  const missing = await withDataSource(cfg.databaseUrl, async (ds) => {
    const deps = { ds, cfg, mailer: createMailer(cfg), log: createLogger('warn') };
    const ids = await unprojectedPieceIds(deps);
    if (ids.length) await recomputeAll(deps, { quiet: true });
    return ids.length;
  });
  if (missing) console.log(`Projections computed for ${missing} pieces.`);

  let inbox: { stop: () => Promise<void> } | null = null;
  if (cfg.SMTP_HOST === '127.0.0.1' && !cfg.SMTP_USER) {
    if (!(await portIsFree(cfg.SMTP_PORT))) throw new Error(`Mail port ${cfg.SMTP_PORT} is already in use; set SMTP_PORT and MAIL_WEB_PORT to free ports.`);
    inbox = await startFakeInbox(cfg.SMTP_PORT, cfg.MAIL_WEB_PORT);
  }
  console.log('Building the client…');
  run('node_modules/.bin/vite', ['build', '--logLevel', 'warn']);
  const app = await startServer(cfg);
  stopOnSignals(async () => {
    await app.stop();
    await inbox?.stop();
  });
  console.log(`\nCrownwatch is running at ${app.url}`);
  if (inbox) console.log(`Fake mail inbox (every e-mail the app sends): http://127.0.0.1:${cfg.MAIL_WEB_PORT}`);
  console.log(`\nDemo sign-ins (password for all: ${DEMO_PASSWORD}):`);
  for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(11)} ${u.email}`);
  console.log('\nStop with Ctrl+C. The local PostgreSQL keeps running; `npm run db:stop` stops it.');
}

main().catch((e: unknown) => {
  console.error(`\nCrownwatch could not start: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
});
