import type { MigrationInterface, QueryRunner } from 'typeorm';
import { REFRESH } from './1796515200000-ReviewItem';

/** The PL/pgSQL refresh around a body of statements (also used by ReviewItemFlagTimes). */
export const refreshFunction = (body: string): string => `
      CREATE OR REPLACE FUNCTION review_item_refresh(ids uuid[]) RETURNS void LANGUAGE plpgsql VOLATILE AS $$
      BEGIN
        IF cardinality(ids) = 0 THEN
          RETURN;
        END IF;
        -- Wait for any other writer of these pieces first (in id order, so two refreshes cannot deadlock);
        -- each statement below takes a fresh snapshot and sees what that writer committed.
        PERFORM 1 FROM piece WHERE id = ANY(ids) ORDER BY id FOR NO KEY UPDATE;
${body}      END $$`;

/**
 * The review summary's refresh as PL/pgSQL: its plans are kept for the session (a SQL function is planned
 * on every call), and a statement that changed no row returns at once. The projection job syncs flags
 * for a hundred pieces at a time and most syncs change nothing, so this runs several times per batch.
 */
export class ReviewItemRefresh1796860800000 implements MigrationInterface {
  name = 'ReviewItemRefresh1796860800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(refreshFunction(REFRESH));
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP FUNCTION review_item_refresh(uuid[])`);
    await q.query(`
      CREATE FUNCTION review_item_refresh(ids uuid[]) RETURNS void LANGUAGE sql VOLATILE AS $$
        SELECT 1 FROM piece WHERE id = ANY(ids) ORDER BY id FOR NO KEY UPDATE;
${REFRESH}      $$`);
  }
}
