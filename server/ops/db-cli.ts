// `npm run db:migrate | db:revert | db:seed | db:stop`
import { loadConfig } from '../config';
import { seedDemo } from '#seed/demo';
import { migrate, prepareDatabase, revertLast, withDataSource } from './database';
import { stopLocalPostgres } from './postgres';

async function main(cmd: string | undefined): Promise<void> {
  const cfg = loadConfig();
  if (cmd === 'stop') return stopLocalPostgres();
  await prepareDatabase(cfg);
  if (cmd === 'migrate') console.log(`Applied: ${(await migrate(cfg.databaseUrl)).join(', ') || 'nothing to apply'}`);
  else if (cmd === 'revert') await revertLast(cfg.databaseUrl);
  else if (cmd === 'seed') {
    await migrate(cfg.databaseUrl);
    const r = await withDataSource(cfg.databaseUrl, (ds) => seedDemo(ds, { bcryptCost: cfg.BCRYPT_COST }));
    console.log(r.created ? 'Demo scenario loaded.' : 'Demo scenario already present; nothing changed.');
  } else throw new Error('usage: db-cli migrate|revert|seed|stop');
}

main(process.argv[2]).catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
