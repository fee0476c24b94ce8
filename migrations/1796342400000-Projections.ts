import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Stored projections (one row per piece, replaced on each run), the flags they raise with their history,
 * and the "engineering" piece status for pieces sent to engineering review.
 */
export class Projections1796342400000 implements MigrationInterface {
  name = 'Projections1796342400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE piece DROP CONSTRAINT piece_status_check`);
    await q.query(`ALTER TABLE piece ADD CONSTRAINT piece_status_check CHECK (status IN ('cast', 'in_storage', 'hold', 'engineering', 'cleared', 'shipped'))`);
    await q.query(`
      CREATE TABLE projection (
        piece_id uuid PRIMARY KEY REFERENCES piece(id),
        plant_id uuid NOT NULL REFERENCES plant(id),
        computed_at timestamptz NOT NULL,
        inputs_hash text NOT NULL,
        method text NOT NULL,
        readings_used integer NOT NULL,
        growth_factor numeric(8, 4) NOT NULL,
        growth_factor_sd numeric(8, 4) NOT NULL,
        elastic_factor numeric(8, 4) NOT NULL,
        latest_mm numeric(12, 4),
        latest_expected_mm numeric(12, 4),
        latest_low_mm numeric(12, 4),
        latest_high_mm numeric(12, 4),
        ship_mm numeric(12, 4),
        ship_low_mm numeric(12, 4),
        ship_high_mm numeric(12, 4),
        erection_mm numeric(12, 4),
        erection_low_mm numeric(12, 4),
        erection_high_mm numeric(12, 4),
        tolerance_mm numeric(12, 4) NOT NULL,
        differential_mm numeric(12, 4) NOT NULL,
        measured_ratio numeric(8, 4),
        curve jsonb NOT NULL,
        note text NOT NULL DEFAULT ''
      )`);
    await q.query(`CREATE INDEX projection_plant_idx ON projection (plant_id)`);
    await q.query(`
      CREATE TABLE piece_flag (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        piece_id uuid NOT NULL REFERENCES piece(id),
        kind text NOT NULL CHECK (kind IN ('outside-band', 'outside-tolerance', 'heading-outside', 'neighbour-mismatch', 'reading-overdue', 'reading-in-doubt')),
        severity integer NOT NULL,
        reason text NOT NULL,
        raised_at timestamptz NOT NULL DEFAULT now(),
        cleared_at timestamptz,
        notified_at timestamptz
      )`);
    await q.query(`CREATE UNIQUE INDEX piece_flag_active_key ON piece_flag (piece_id, kind) WHERE cleared_at IS NULL`);
    await q.query(`CREATE INDEX piece_flag_plant_active_idx ON piece_flag (plant_id) WHERE cleared_at IS NULL`);
    await q.query(`CREATE INDEX piece_flag_unnotified_idx ON piece_flag (plant_id) WHERE notified_at IS NULL AND cleared_at IS NULL`);
    await q.query(`
      CREATE TABLE projection_failure (
        piece_id uuid PRIMARY KEY REFERENCES piece(id),
        plant_id uuid NOT NULL REFERENCES plant(id),
        failed_at timestamptz NOT NULL DEFAULT now(),
        message text NOT NULL
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE projection_failure`);
    await q.query(`DROP TABLE piece_flag`);
    await q.query(`DROP TABLE projection`);
    await q.query(`UPDATE piece SET status = 'hold' WHERE status = 'engineering'`);
    await q.query(`ALTER TABLE piece DROP CONSTRAINT piece_status_check`);
    await q.query(`ALTER TABLE piece ADD CONSTRAINT piece_status_check CHECK (status IN ('cast', 'in_storage', 'hold', 'cleared', 'shipped'))`);
  }
}
