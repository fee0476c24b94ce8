import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The trigger functions and the compaction (also restored by ReviewPageRevision's down). A row counts
 * while its piece is not shipped (the review list's own condition). An update adds what the new rows
 * count and takes away what the old ones did; rows added count up, rows removed count down.
 */
export const COUNT_FUNCTIONS = [
  `CREATE OR REPLACE FUNCTION review_count_delta() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        INSERT INTO review_count (plant_id, flagged, needs_decision)
        SELECT plant_id, sum(f), sum(n) FROM (
          SELECT plant_id, 1 AS f, needs_decision::int AS n FROM new_rows WHERE status <> 'shipped'
          UNION ALL
          SELECT plant_id, -1, -(needs_decision::int) FROM old_rows WHERE status <> 'shipped'
        ) x
        GROUP BY plant_id
        HAVING sum(f) <> 0 OR sum(n) <> 0;
        RETURN NULL;
      END $$`,
  ...([['review_count_insert', 'new_rows', ''], ['review_count_delete', 'old_rows', '-']] as const).map(
    ([fn, rows, sign]) => `CREATE OR REPLACE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN
          INSERT INTO review_count (plant_id, flagged, needs_decision)
          SELECT plant_id, ${sign}count(*), ${sign}count(*) FILTER (WHERE needs_decision) FROM ${rows} WHERE status <> 'shipped' GROUP BY plant_id;
          RETURN NULL;
        END $$`,
  ),
  `CREATE OR REPLACE FUNCTION review_count_compact() RETURNS void LANGUAGE sql VOLATILE AS $$
        WITH gone AS (DELETE FROM review_count RETURNING plant_id, flagged, needs_decision)
        INSERT INTO review_count (plant_id, flagged, needs_decision)
        SELECT plant_id, sum(flagged), sum(needs_decision) FROM gone GROUP BY plant_id;
      $$`,
];

/**
 * The totals of the review list's two unfiltered views (all flagged, needs a decision) per plant, so a
 * page does not count thousands of `review_item` rows on every request.
 *
 * Kept as rows of deltas, appended by a statement-level trigger on `review_item`: writers never wait on
 * one hot counter row (the projection workers change flags of one plant at the same time). A total is
 * the sum of its plant's rows; `review_count_compact()` folds them into one row per plant (after each
 * projection batch and each night), each in its own short transaction.
 */
export class ReviewCount1796947200000 implements MigrationInterface {
  name = 'ReviewCount1796947200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE review_count (
        plant_id uuid NOT NULL REFERENCES plant(id) ON DELETE CASCADE,
        flagged integer NOT NULL,
        needs_decision integer NOT NULL
      )`);
    await q.query(`CREATE INDEX review_count_plant_idx ON review_count (plant_id)`);
    for (const sql of COUNT_FUNCTIONS) await q.query(sql);
    await q.query(`CREATE TRIGGER review_count_insert AFTER INSERT ON review_item REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION review_count_insert()`);
    await q.query(`CREATE TRIGGER review_count_update AFTER UPDATE ON review_item REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION review_count_delta()`);
    await q.query(`CREATE TRIGGER review_count_delete AFTER DELETE ON review_item REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION review_count_delete()`);
    await q.query(`
      INSERT INTO review_count (plant_id, flagged, needs_decision)
      SELECT plant_id, count(*), count(*) FILTER (WHERE needs_decision) FROM review_item WHERE status <> 'shipped' GROUP BY plant_id`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['insert', 'update', 'delete']) await q.query(`DROP TRIGGER review_count_${t} ON review_item`);
    for (const f of ['review_count_insert', 'review_count_delete', 'review_count_delta', 'review_count_compact']) await q.query(`DROP FUNCTION ${f}()`);
    await q.query(`DROP TABLE review_count`);
  }
}
