// A deterministic plant-sized dataset for the benchmarks: 50,000 pieces, 1,000,000 readings, their
// designs, projections and flags, made inside PostgreSQL with generate_series (seconds, not minutes).
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { DEMO_DESIGNS } from '#seed/designs';
import { hashPassword } from '../auth/password';
import { loadConfig, type Config } from '../config';
import { migrate, prepareDatabase } from '../ops/database';

export interface Dataset { plantId: string; pieceIds: string[]; engineerEmail: string; password: string }

export async function makeDataset(ds: DataSource, pieces = 50_000, readingsPerPiece = 20): Promise<Dataset> {
  const password = 'bench password 1';
  const [plant] = await ds.query(`INSERT INTO plant (name, code, time_zone, unit_system) VALUES ('Bench yard', 'BENCH-${Date.now()}', 'America/Chicago', 'us') RETURNING id`);
  const email = `qc-${Date.now()}@bench.example`;
  await ds.query(`INSERT INTO app_user (plant_id, email, name, role, password_hash) VALUES ($1, $2, 'Bench QC', 'qc_manager', $3)`, [plant.id, email, await hashPassword(password, 10)]);
  const [job] = await ds.query(`INSERT INTO job (plant_id, number, name) VALUES ($1, 'J-B', 'Bench') RETURNING id`, [plant.id]);
  const designIds: string[] = [];
  for (const d of DEMO_DESIGNS) designIds.push((await ds.query(`INSERT INTO member_design (plant_id, code, name, product_type, spec) VALUES ($1, $2, $3, $4, $5) RETURNING id`, [plant.id, d.code, d.name, d.productType, JSON.stringify(d.spec)]))[0].id);
  await ds.query(
    `INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date, ship_date, erection_date, bay, bay_position, status)
     SELECT $1, $2, ($3::uuid[])[1 + g % 4], 'B-' || g, date '2026-06-01' + (g % 150), date '2026-06-02' + (g % 150), date '2026-08-01' + (g % 150), date '2026-08-03' + (g % 150),
            CASE WHEN g % 3 = 0 THEN 'Bay ' || (g / 30) END, CASE WHEN g % 3 = 0 THEN 1 + (g / 3) % 10 END, CASE WHEN g % 5 = 0 THEN 'shipped' ELSE 'in_storage' END
       FROM generate_series(1, $4) g`,
    [plant.id, job.id, designIds, pieces],
  );
  const [inspector] = await ds.query(`SELECT id FROM app_user WHERE plant_id = $1`, [plant.id]);
  await ds.query(
    `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, taken_by, idempotency_key, request_hash)
     SELECT $1, p.id, p.cast_date + (r * 5) * interval '1 day' + interval '13 hours', 20 + r * 1.5875, '1', 'in', 'level', 'dunnage', $2, 'bench-' || p.id || '-' || r, 'bench'
       FROM piece p, generate_series(1, $3) r WHERE p.plant_id = $1`,
    [plant.id, inspector.id, readingsPerPiece],
  );
  await ds.query(
    `INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                             latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, ship_mm, ship_low_mm, ship_high_mm, erection_mm, erection_low_mm, erection_high_mm,
                             tolerance_mm, differential_mm, measured_ratio, curve, note)
     SELECT id, $1, now(), 'bench', 'aashto', 20, 1, 0.1, 1, 50, 48, 40, 56, 52, 45, 59, 52, 45, 59, 19.05, 19.05, 1.04,
            float4send(1) || float4send(20) || float4send(15) || float4send(25) || float4send(1) || float4send(39) || float4send(20) || float4send(15) || float4send(25), 'bench'
       FROM piece WHERE plant_id = $1`,
    [plant.id],
  );
  await ds.query(
    `INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason)
     SELECT $1, id, 'outside-band', 2, 'bench flag' FROM piece WHERE plant_id = $1 AND status <> 'shipped' AND (mark ~ '7$')`,
    [plant.id],
  );
  // A yard database in steady state has been vacuumed (visibility map set, statistics current).
  await ds.query('VACUUM ANALYZE');
  const ids: Array<{ id: string }> = await ds.query(`SELECT id FROM piece WHERE plant_id = $1 ORDER BY id LIMIT 1000`, [plant.id]);
  return { plantId: plant.id, pieceIds: ids.map((r) => r.id), engineerEmail: email, password };
}

/** Drops and re-creates the `crownwatch_bench` database on the local cluster, migrated and empty. */
export async function freshBenchDatabase(): Promise<Config> {
  const cfg = loadConfig({ ...process.env, PG_DATABASE: 'crownwatch_bench', LOG_LEVEL: 'silent', JOBS: 'off', NODE_ENV: 'test' });
  await prepareDatabase(cfg);
  const admin = new pg.Client({ connectionString: cfg.databaseUrl.replace(/\/crownwatch_bench$/, '/postgres') });
  await admin.connect();
  await admin.query('DROP DATABASE IF EXISTS crownwatch_bench WITH (FORCE)');
  await admin.query('CREATE DATABASE crownwatch_bench');
  await admin.end();
  await migrate(cfg.databaseUrl);
  return cfg;
}
