import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * For projections written in batches: the neighbour check reads the pieces of many bays at once (an
 * index on the bay), and the stored curve (several kilobytes of JSON per piece, rewritten every night)
 * is compressed with lz4, which costs far less CPU than PostgreSQL's default pglz.
 */
export class ProjectionBatch1796601600000 implements MigrationInterface {
  name = 'ProjectionBatch1796601600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX piece_bay_idx ON piece (plant_id, job_id, bay) WHERE bay IS NOT NULL`);
    await q.query(`ALTER TABLE projection ALTER COLUMN curve SET COMPRESSION lz4`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE projection ALTER COLUMN curve SET COMPRESSION pglz`);
    await q.query(`DROP INDEX piece_bay_idx`);
  }
}
