import { createHash } from 'node:crypto';
import type pg from 'pg';
import { DataSource, type EntityManager } from 'typeorm';
import type { PostgresDriver } from 'typeorm/driver/postgres/PostgresDriver.js';

const names = new Map<string, string>();
const nameOf = (sql: string): string => {
  let n = names.get(sql);
  if (!n) names.set(sql, (n = `cw_${createHash('sha1').update(sql).digest('hex').slice(0, 20)}`));
  return n;
};

/**
 * A read on the hot paths (session, review list, piece page) as a named prepared statement: each pool
 * connection parses and plans it once, where an unnamed statement is planned again on every request
 * (2 ms of planning on the review list, more than its execution). Inside a transaction (an
 * EntityManager) it runs on that transaction's connection as usual.
 */
export async function preparedRows<T = Record<string, unknown>>(db: DataSource | EntityManager, sql: string, args: unknown[]): Promise<T[]> {
  if (!(db instanceof DataSource)) return db.query(sql, args);
  const pool = (db.driver as PostgresDriver).master as pg.Pool;
  const result = await pool.query({ name: nameOf(sql), text: sql, values: args });
  return result.rows as T[];
}
