import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The piece list pages a plant's pieces by mark, cast date, ship date or status: with an index per sort
 * key the first pages are read off the index instead of sorting every piece of the plant per request.
 */
export class PieceListIndexes1796688000000 implements MigrationInterface {
  name = 'PieceListIndexes1796688000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX piece_list_mark_idx ON piece (plant_id, mark)`);
    await q.query(`CREATE INDEX piece_list_cast_idx ON piece (plant_id, cast_date, mark)`);
    await q.query(`CREATE INDEX piece_list_ship_idx ON piece (plant_id, ship_date, mark)`);
    await q.query(`CREATE INDEX piece_list_status_idx ON piece (plant_id, status, mark)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const name of ['piece_list_mark_idx', 'piece_list_cast_idx', 'piece_list_ship_idx', 'piece_list_status_idx']) await q.query(`DROP INDEX ${name}`);
  }
}
