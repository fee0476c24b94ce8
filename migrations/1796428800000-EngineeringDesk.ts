import type { MigrationInterface, QueryRunner } from 'typeorm';

/** CSV imports with their saved column mappings, and the settings and calibration of product families. */
export class EngineeringDesk1796428800000 implements MigrationInterface {
  name = 'EngineeringDesk1796428800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE csv_import (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        kind text NOT NULL CHECK (kind IN ('readings', 'pieces')),
        file_hash text NOT NULL,
        filename text NOT NULL,
        size integer NOT NULL,
        content text NOT NULL,
        delimiter text NOT NULL,
        header jsonb NOT NULL,
        status text NOT NULL DEFAULT 'uploaded' CHECK (status IN ('uploaded', 'committed', 'rejected')),
        mapping jsonb,
        all_or_nothing boolean,
        rows_total integer,
        rows_added integer,
        rows_duplicate integer,
        rows_rejected integer,
        rejected_csv text,
        created_by uuid NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        committed_at timestamptz,
        UNIQUE (plant_id, kind, file_hash)
      )`);
    await q.query(`
      CREATE TABLE csv_mapping (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        kind text NOT NULL,
        name text NOT NULL,
        mapping jsonb NOT NULL,
        created_by uuid NOT NULL REFERENCES app_user(id),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (plant_id, kind, name)
      )`);
    await q.query(`
      CREATE TABLE family_setting (
        plant_id uuid NOT NULL REFERENCES plant(id),
        product_type text NOT NULL,
        settings jsonb NOT NULL,
        updated_by uuid REFERENCES app_user(id),
        updated_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (plant_id, product_type)
      )`);
    await q.query(`
      CREATE TABLE calibration_adoption (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        product_type text NOT NULL,
        growth_factor numeric(8, 4) NOT NULL,
        growth_factor_sd numeric(8, 4) NOT NULL,
        evidence jsonb NOT NULL,
        adopted_by uuid NOT NULL REFERENCES app_user(id),
        adopted_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX calibration_adoption_family_idx ON calibration_adoption (plant_id, product_type, adopted_at DESC)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['calibration_adoption', 'family_setting', 'csv_mapping', 'csv_import']) await q.query(`DROP TABLE ${t}`);
  }
}
