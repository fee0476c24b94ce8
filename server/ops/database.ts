import type { Config } from '../config';
import { createDataSource } from '../db/data-source';
import { ensureDatabase, ensureLocalPostgres } from './postgres';

/**
 * The database of this config exists and is reachable: the local cluster unless DATABASE_URL is set.
 * Returns true when this call started the local cluster (so a one-off run can stop it again).
 */
export async function prepareDatabase(cfg: Config): Promise<boolean> {
  const started = cfg.DATABASE_URL ? false : await ensureLocalPostgres(cfg.PG_PORT);
  await ensureDatabase(cfg.databaseUrl);
  return started;
}

export async function migrate(url: string): Promise<string[]> {
  const ds = createDataSource(url, 2);
  await ds.initialize();
  try {
    const ran = await ds.runMigrations({ transaction: 'each' });
    return ran.map((m) => m.name);
  } finally {
    await ds.destroy();
  }
}

export async function revertLast(url: string): Promise<void> {
  const ds = createDataSource(url, 2);
  await ds.initialize();
  try {
    await ds.undoLastMigration({ transaction: 'each' });
  } finally {
    await ds.destroy();
  }
}

export async function withDataSource<T>(url: string, fn: (ds: ReturnType<typeof createDataSource>) => Promise<T>): Promise<T> {
  const ds = createDataSource(url, 4);
  await ds.initialize();
  try {
    return await fn(ds);
  } finally {
    await ds.destroy();
  }
}
