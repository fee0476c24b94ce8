import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Plants, users, sign-in tokens, jobs, designs, pieces, readings, decisions and the audit log. */
export class Initial1796169600000 implements MigrationInterface {
  name = 'Initial1796169600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);
    await q.query(`
      CREATE TABLE plant (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name text NOT NULL,
        code text NOT NULL UNIQUE,
        time_zone text NOT NULL,
        unit_system text NOT NULL CHECK (unit_system IN ('us', 'si')),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE job (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        number text NOT NULL,
        name text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (plant_id, number)
      )`);
    await q.query(`
      CREATE TABLE app_user (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        email text NOT NULL,
        name text NOT NULL,
        role text NOT NULL CHECK (role IN ('inspector', 'qc_manager', 'engineer', 'admin', 'viewer')),
        password_hash text,
        active boolean NOT NULL DEFAULT true,
        job_id uuid REFERENCES job(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX app_user_email_key ON app_user (lower(email))`);
    await q.query(`CREATE INDEX app_user_plant_idx ON app_user (plant_id)`);
    await q.query(`
      CREATE TABLE auth_token (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES app_user(id),
        kind text NOT NULL CHECK (kind IN ('reset', 'invite')),
        token_hash text NOT NULL UNIQUE,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE member_design (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        code text NOT NULL,
        name text NOT NULL,
        product_type text NOT NULL,
        version integer NOT NULL DEFAULT 1,
        spec jsonb NOT NULL,
        created_by uuid REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (plant_id, code, version)
      )`);
    await q.query(`
      CREATE TABLE piece (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        job_id uuid NOT NULL REFERENCES job(id),
        design_id uuid NOT NULL REFERENCES member_design(id),
        mark text NOT NULL,
        mark_key text GENERATED ALWAYS AS (lower(regexp_replace(mark, '[^A-Za-z0-9]', '', 'g'))) STORED,
        bed text,
        cast_date date NOT NULL,
        release_date date NOT NULL,
        ship_date date,
        erection_date date,
        bay text,
        bay_position integer,
        status text NOT NULL DEFAULT 'in_storage' CHECK (status IN ('cast', 'in_storage', 'hold', 'cleared', 'shipped')),
        version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (release_date >= cast_date),
        UNIQUE (plant_id, job_id, mark)
      )`);
    await q.query(`CREATE INDEX piece_plant_mark_idx ON piece (plant_id, mark_key text_pattern_ops)`);
    await q.query(`CREATE INDEX piece_plant_status_idx ON piece (plant_id, status, ship_date)`);
    await q.query(`CREATE INDEX piece_job_idx ON piece (job_id)`);
    await q.query(`CREATE INDEX piece_design_idx ON piece (design_id)`);
    await q.query(`
      CREATE TABLE reading (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        piece_id uuid NOT NULL REFERENCES piece(id),
        taken_at timestamptz NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now(),
        value_mm numeric(12, 6) NOT NULL,
        entered_text text NOT NULL,
        entered_unit text NOT NULL CHECK (entered_unit IN ('in', 'mm')),
        method text NOT NULL,
        support text NOT NULL,
        overhang_mm numeric(10, 3),
        air_temp_c numeric(5, 1),
        sky text,
        note text,
        taken_by uuid NOT NULL REFERENCES app_user(id),
        idempotency_key text NOT NULL,
        request_hash text NOT NULL,
        supersedes uuid REFERENCES reading(id),
        superseded_by uuid REFERENCES reading(id),
        correction_reason text,
        UNIQUE (plant_id, idempotency_key)
      )`);
    await q.query(`CREATE INDEX reading_piece_taken_idx ON reading (piece_id, taken_at DESC)`);
    await q.query(`CREATE INDEX reading_plant_taken_idx ON reading (plant_id, taken_at DESC)`);
    await q.query(`
      CREATE TABLE decision (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plant_id uuid NOT NULL REFERENCES plant(id),
        piece_id uuid NOT NULL REFERENCES piece(id),
        kind text NOT NULL CHECK (kind IN ('accept', 'hold', 'engineering', 'remeasure', 'clear')),
        comment text NOT NULL DEFAULT '',
        decided_by uuid NOT NULL REFERENCES app_user(id),
        decided_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX decision_piece_idx ON decision (piece_id, decided_at DESC)`);
    await q.query(`
      CREATE TABLE audit_event (
        id bigserial PRIMARY KEY,
        plant_id uuid REFERENCES plant(id),
        user_id uuid REFERENCES app_user(id),
        action text NOT NULL,
        entity text NOT NULL,
        entity_id text,
        before jsonb,
        after jsonb,
        at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX audit_event_plant_at_idx ON audit_event (plant_id, at DESC)`);
    await q.query(`CREATE INDEX audit_event_entity_idx ON audit_event (entity, entity_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['audit_event', 'decision', 'reading', 'piece', 'member_design', 'auth_token', 'app_user', 'job', 'plant']) {
      await q.query(`DROP TABLE ${t}`);
    }
  }
}
