import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A hash of what a projection stores (values, curve, note), so a run whose result is the one already
 * stored (most pieces on most nights) only marks it as checked instead of rewriting the curve.
 */
export class ProjectionResultHash1796774400000 implements MigrationInterface {
  name = 'ProjectionResultHash1796774400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE projection ADD COLUMN result_hash text`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE projection DROP COLUMN result_hash`);
  }
}
