import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The nightly projection reads every active piece's live readings. A plant's readings arrive day by day,
 * so the twenty of one piece lie on twenty different pages of the table: the nightly load spent most of
 * its database time fetching those pages (EXPLAIN: 4,600 heap pages for 5,000 readings of 250 pieces).
 * This index holds what the load reads of a live reading, in the order it reads them, so the load is
 * an index-only scan. That holds for pages vacuum has marked all-visible; by default autovacuum visits a
 * table that is only added to after a fifth of its size in new rows (200,000 readings, months of a
 * plant's work, whose pages the load would fetch again), so the table is set to be visited after 1 %
 * (vacuuming pages only added to is cheap: it reads just those). Superseded readings are left out: the
 * load never reads them; the existing index on (piece_id, taken_at) still serves the piece's history.
 */
export class ReadingLiveIndex1797292800000 implements MigrationInterface {
  name = 'ReadingLiveIndex1797292800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX reading_piece_live_idx ON reading (piece_id, taken_at) INCLUDE (id, value_mm, support, sky) WHERE superseded_by IS NULL`);
    await q.query(`ALTER TABLE reading SET (autovacuum_vacuum_insert_scale_factor = 0.01)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE reading RESET (autovacuum_vacuum_insert_scale_factor)`);
    await q.query(`DROP INDEX reading_piece_live_idx`);
  }
}
