import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DESIGNS } from '#seed/designs';
import { loadConfig } from '#server/config';
import type { DataSource } from 'typeorm';
import { createJobs, QUEUES } from '#server/jobs/queue';
import { createMailer } from '#server/mail/mailer';
import { recomputeAll } from '#server/projections/projection.service';
import { faultPlant, migratedCluster, type Cluster } from './cluster';
import { exited, killLeftovers, startServerProcess } from './server-process';

// A projection worker (the server process with its job workers) killed with SIGKILL while it works
// through the nightly run: its unfinished batch expires, runs again after the restart, and what is
// stored in the end is what an uninterrupted run stores.
const PORT = 5197;
const PIECES = 2_000;
const WORKER_ENV = { JOBS: 'on', PROJECTION_EXPIRE_SECONDS: '3', JOB_MAINTENANCE_SECONDS: '1' };
let cluster: Cluster;
let ds: DataSource;

beforeAll(async () => {
  ({ cluster, ds } = await migratedCluster(54343, 4));
  const { plantId, userId, jobId, designId } = await faultPlant(ds, { tag: 'W', email: 'w@w.example', role: 'inspector', passwordHash: 'x', design: DEMO_DESIGNS[0]! });
  // Pieces cast 10 to 59 days ago, shipping in a month, in bays of ten, each with six readings that
  // wander around a plausible camber so that some pieces raise flags.
  await ds.query(
    `INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date, ship_date, bay, bay_position, status)
     SELECT $1, $2, $3, 'W-' || g, current_date - 10 - g % 50, current_date - 9 - g % 50, current_date + 30, 'Bay ' || (g / 10), g % 10 + 1, 'in_storage'
       FROM generate_series(1, $4) g`,
    [plantId, jobId, designId, PIECES],
  );
  await ds.query(
    `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, taken_by, idempotency_key, request_hash)
     SELECT $1, p.id, p.release_date + r * interval '1 day' + interval '14 hours', 20 + r * 0.8 + (hashtext(p.mark) % 7), '1', 'in', 'level', 'dunnage', $2, p.id || '-' || r, 'fault'
       FROM piece p, generate_series(0, 5) r WHERE p.plant_id = $1`,
    [plantId, userId],
  );
});
afterAll(async () => {
  killLeftovers();
  await ds?.destroy().catch(() => undefined);
  cluster?.destroy();
});

const stored = async (): Promise<unknown[]> =>
  ds.query(`
    SELECT p.piece_id, p.inputs_hash, p.latest_mm, p.ship_mm, p.erection_mm, p.growth_factor, p.curve::text AS curve,
           (SELECT json_agg(json_build_object('kind', f.kind, 'severity', f.severity, 'reason', f.reason) ORDER BY f.kind)
              FROM piece_flag f WHERE f.piece_id = p.piece_id AND f.cleared_at IS NULL) AS flags
      FROM projection p ORDER BY p.piece_id`);
const count = async (sql: string): Promise<number> => (await ds.query(sql))[0].n;

describe('a projection worker killed mid-job', () => {
  it('when the worker process is killed during the nightly run, then its jobs run again and the stored result is that of an uninterrupted run', async () => {
    let worker = await startServerProcess(PORT, cluster.url, WORKER_ENV);
    const cfg = loadConfig({ ...WORKER_ENV, DATABASE_URL: cluster.url, NODE_ENV: 'test', LOG_LEVEL: 'silent' });
    const deps = { ds, cfg, mailer: createMailer(cfg), log: pino({ level: 'silent' }) };
    const queue = await createJobs(deps, { schedule: false }); // only to send: this one runs no workers
    expect(await queue.projectAll()).toBe(PIECES);
    // Kill the worker as soon as it has stored some projections and holds a batch it has not finished.
    let active = 0;
    for (let k = 0; k < 2_000 && active === 0; k++) {
      const done = await count(`SELECT count(*)::int AS n FROM projection`);
      if (done > 0) active = await count(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = '${QUEUES.nightlyBatch}' AND state = 'active'`);
      if (active === 0) await new Promise((r) => setTimeout(r, 10));
    }
    worker.kill('SIGKILL');
    await exited(worker);
    const atKill = await count(`SELECT count(*)::int AS n FROM projection`);
    expect(active).toBeGreaterThan(0);
    expect(atKill).toBeLessThan(PIECES);

    worker = await startServerProcess(PORT, cluster.url, WORKER_ENV);
    const until = Date.now() + 120_000;
    while (Date.now() < until && (await count(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = '${QUEUES.nightlyBatch}' AND state < 'completed'`)) > 0) {
      await new Promise((r) => setTimeout(r, 250));
    }
    const exit = exited(worker);
    worker.kill('SIGTERM');
    expect(await exit).toBe(0);
    await queue.stop();
    expect(await count(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = '${QUEUES.nightlyBatch}' AND state <> 'completed'`)).toBe(0);
    expect(await count(`SELECT count(*)::int AS n FROM projection_failure`)).toBe(0);

    const afterCrash = await stored();
    expect(afterCrash).toHaveLength(PIECES);
    // The same pieces recomputed from scratch in one process, without any interruption.
    await ds.query(`DELETE FROM piece_flag`);
    await ds.query(`DELETE FROM projection`);
    await recomputeAll(deps);
    expect(await stored()).toEqual(afterCrash);
    expect(await count(`SELECT count(*)::int AS n FROM piece_flag WHERE cleared_at IS NULL`)).toBeGreaterThan(0); // the comparison covers flags too
  });
});
