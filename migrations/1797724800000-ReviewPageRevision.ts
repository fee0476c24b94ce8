import type { MigrationInterface, QueryRunner } from 'typeorm';
import { COUNT_FUNCTIONS } from './1796947200000-ReviewCount';

/**
 * A revision of each plant's review list, so the server can keep the list's pages it has built and
 * check one by reading the revision instead of building it again (README, Performance). Every statement
 * that writes `review_item` rows of a plant adds 1 to it, in the same delta rows that keep the list's
 * totals (`review_count`, migration ReviewCount): writers only append, so none waits on a hot counter
 * row, and the compaction keeps the sum, so a revision never repeats. The list reads nothing but
 * `review_item` (whose rows triggers keep from flags, decisions, pieces, projections, jobs and designs),
 * its totals, and the day (the page is kept per plant day).
 */
const REVISION_FUNCTIONS = [
  // An update: the new rows count, the old ones are taken away; one revision per plant touched.
  `CREATE OR REPLACE FUNCTION review_count_delta() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        INSERT INTO review_count (plant_id, flagged, needs_decision, rev)
        SELECT plant_id, sum(f), sum(n), 1 FROM (
          SELECT plant_id, (status <> 'shipped')::int AS f, (status <> 'shipped' AND needs_decision)::int AS n FROM new_rows
          UNION ALL
          SELECT plant_id, -(status <> 'shipped')::int, -(status <> 'shipped' AND needs_decision)::int FROM old_rows
        ) x
        GROUP BY plant_id;
        RETURN NULL;
      END $$`,
  ...([['review_count_insert', 'new_rows', ''], ['review_count_delete', 'old_rows', '-']] as const).map(
    ([fn, rows, sign]) => `CREATE OR REPLACE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN
          INSERT INTO review_count (plant_id, flagged, needs_decision, rev)
          SELECT plant_id, ${sign}count(*) FILTER (WHERE status <> 'shipped'), ${sign}count(*) FILTER (WHERE status <> 'shipped' AND needs_decision), 1
            FROM ${rows} GROUP BY plant_id;
          RETURN NULL;
        END $$`,
  ),
  `CREATE OR REPLACE FUNCTION review_count_compact() RETURNS void LANGUAGE sql VOLATILE AS $$
        WITH gone AS (DELETE FROM review_count RETURNING plant_id, flagged, needs_decision, rev)
        INSERT INTO review_count (plant_id, flagged, needs_decision, rev)
        SELECT plant_id, sum(flagged), sum(needs_decision), sum(rev) FROM gone GROUP BY plant_id;
      $$`,
];

export class ReviewPageRevision1797724800000 implements MigrationInterface {
  name = 'ReviewPageRevision1797724800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE review_count ADD COLUMN rev bigint NOT NULL DEFAULT 0`);
    for (const sql of REVISION_FUNCTIONS) await q.query(sql);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const sql of COUNT_FUNCTIONS) await q.query(sql);
    await q.query(`ALTER TABLE review_count DROP COLUMN rev`);
  }
}
