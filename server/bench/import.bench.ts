// `npm run bench:import`: rows per second of a 100,000-row readings CSV through the real endpoint
// (upload: decode, header; commit: parse, validate, map, duplicate check, insert) beside PostgreSQL's own
// `\copy` of the same rows into the same table with the same indexes, in the same run. Target: ≥ 0.5.
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import pino from 'pino';
import request from 'supertest';
import { createApp } from '../app';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { createMailer } from '../mail/mailer';
import { migrate, prepareDatabase } from '../ops/database';
import { postgresBinDir } from '../ops/postgres';
import { hashPassword } from '../auth/password';
import { DEMO_DESIGNS } from '#seed/designs';
import { median, spread } from './stats';

const ROWS = 100_000;
const RUNS = 3;

async function main(): Promise<void> {
  const cfg0 = loadConfig({ ...process.env, PG_DATABASE: 'crownwatch_bench', LOG_LEVEL: 'silent', JOBS: 'off' });
  await prepareDatabase(cfg0);
  const admin = new pg.Client({ connectionString: cfg0.databaseUrl.replace(/\/crownwatch_bench$/, '/postgres') });
  await admin.connect();
  await admin.query('DROP DATABASE IF EXISTS crownwatch_bench WITH (FORCE)');
  await admin.query('CREATE DATABASE crownwatch_bench');
  await admin.end();
  await migrate(cfg0.databaseUrl);
  const ds = createDataSource(cfg0.databaseUrl, 4);
  await ds.initialize();
  const [plant] = await ds.query(`INSERT INTO plant (name, code, time_zone, unit_system) VALUES ('Bench plant', 'BENCH', 'America/Chicago', 'us') RETURNING id`);
  const [user] = await ds.query(`INSERT INTO app_user (plant_id, email, name, role, password_hash) VALUES ($1, 'bench@bench.example', 'Bench', 'engineer', $2) RETURNING id`, [plant.id, await hashPassword('bench password 1', 10)]);
  const [job] = await ds.query(`INSERT INTO job (plant_id, number, name) VALUES ($1, 'J-1', 'Bench') RETURNING id`, [plant.id]);
  const [design] = await ds.query(`INSERT INTO member_design (plant_id, code, name, product_type, spec) VALUES ($1, 'DT', 'DT', 'double-tee', $2) RETURNING id`, [plant.id, JSON.stringify(DEMO_DESIGNS[0]!.spec)]);
  const pieceIds: string[] = [];
  for (let i = 0; i < 100; i++) pieceIds.push((await ds.query(`INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date) VALUES ($1, $2, $3, $4, '2025-01-01', '2025-01-02') RETURNING id`, [plant.id, job.id, design.id, `B-${i}`]))[0].id);
  const app = createApp({ ds, cfg: cfg0, mailer: createMailer(cfg0), log: pino({ level: 'silent' }) }, null);
  const agent = request.agent(app);
  const login = await agent.post('/api/auth/login').send({ email: 'bench@bench.example', password: 'bench password 1' });
  const csrf = /cw_csrf=([^;]+)/.exec(([] as string[]).concat(login.headers['set-cookie'] ?? []).join(';'))![1]!;
  const psql = join(postgresBinDir() ?? '/usr/bin', 'psql');

  const ours: number[] = [];
  const copy: number[] = [];
  for (let run = 0; run < RUNS; run++) {
    // Each run its own timestamps, so nothing is a duplicate of an earlier run.
    const base = Date.UTC(2025, 1 + run * 3, 1, 13, 0);
    const lines = ['mark,date,camber'];
    const copyLines: string[] = [];
    for (let i = 0; i < ROWS; i++) {
      const piece = i % 100;
      const at = new Date(base + Math.floor(i / 100) * 60_000);
      lines.push(`B-${piece},${at.toISOString().replace('T', ' ').slice(0, 16)},1 ${1 + (i % 15)}/16`);
      copyLines.push([plant.id, pieceIds[piece], new Date(at.getTime() + 30 * 24 * 3600_000).toISOString(), (25.4 + i % 16).toFixed(6), '1 1/16', 'in', 'level', 'bed', user.id, `copy-${run}-${i}`, 'copy'].join(','));
    }
    const csv = Buffer.from(`${lines.join('\n')}\n`);
    const t0 = process.hrtime.bigint();
    const up = await agent.post('/api/imports').set('X-CSRF-Token', csrf).field('kind', 'readings').attach('file', csv, `bench-${run}.csv`);
    const done = await agent.post(`/api/imports/${up.body.id}/commit`).set('X-CSRF-Token', csrf).send({ mapping: up.body.proposedMapping, allOrNothing: false });
    const s = Number(process.hrtime.bigint() - t0) / 1e9;
    if (done.body.result?.added !== ROWS) throw new Error(`the import added ${JSON.stringify(done.body.result ?? done.body)}`);
    ours.push(ROWS / s);
    const file = join(tmpdir(), `crownwatch-copy-${run}.csv`);
    writeFileSync(file, `${copyLines.join('\n')}\n`);
    const c0 = process.hrtime.bigint();
    const r = spawnSync(psql, [cfg0.databaseUrl, '-q', '-c', `\\copy reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, taken_by, idempotency_key, request_hash) FROM '${file}' CSV`], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`\\copy failed: ${r.stderr}`);
    copy.push(ROWS / (Number(process.hrtime.bigint() - c0) / 1e9));
  }
  console.log(`import: ${ROWS.toLocaleString('en-US')}-row readings CSV, ${RUNS} runs each`);
  console.log(`through the endpoint (upload + commit): median ${Math.round(median(ours)).toLocaleString('en-US')} rows/s (runs ${spread(ours)})`);
  console.log(`psql \\copy of the same rows, same table and indexes: median ${Math.round(median(copy)).toLocaleString('en-US')} rows/s (runs ${spread(copy)})`);
  console.log(`ratio: ${(median(ours) / median(copy)).toFixed(2)} (target ≥ 0.5)`);
  await ds.destroy();
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
