import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { loadConfig } from '#server/config';
import type { DataSource } from 'typeorm';
import { createMailer } from '#server/mail/mailer';
import { hashPassword } from '#server/auth/password';
import { faultPlant, migratedCluster, type Cluster } from './cluster';

let cluster: Cluster;
let app: ReturnType<typeof createApp>;
let ds: DataSource;
let headers: Record<string, string>;
let pieceId: string;

beforeAll(async () => {
  ({ cluster, ds } = await migratedCluster(54341, 4));
  const cfg = loadConfig({ ...process.env, DATABASE_URL: cluster.url, NODE_ENV: 'test', LOG_LEVEL: 'silent' });
  const plant = await faultPlant(ds, { tag: 'F', email: 'f@f.example', role: 'inspector', passwordHash: await hashPassword('fault password 1', 10) });
  [{ id: pieceId }] = await ds.query(`INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date) VALUES ($1, $2, $3, 'P-1', '2026-01-01', '2026-01-02') RETURNING id`, [plant.plantId, plant.jobId, plant.designId]);
  app = createApp({ ds, cfg, mailer: createMailer(cfg), log: pino({ level: 'silent' }) }, null);
  const login = await request(app).post('/api/auth/login').send({ email: 'f@f.example', password: 'fault password 1' });
  const cookies = ([] as string[]).concat(login.headers['set-cookie'] ?? []);
  const csrf = /cw_csrf=([^;]+)/.exec(cookies.join(';'))![1]!;
  headers = { Cookie: cookies.map((c) => c.split(';')[0]).join('; '), 'X-CSRF-Token': csrf };
});
afterAll(async () => {
  await ds?.destroy().catch(() => undefined);
  cluster?.destroy();
});

const post = (i: number) =>
  request(app).post('/api/readings').set(headers).set('Idempotency-Key', `fault-key-${i}`)
    .send({ pieceId, value: '1 3/8', unit: 'in', takenAt: new Date(Date.UTC(2026, 0, 3) + i * 60_000).toISOString(), method: 'level', support: 'bed' });

describe('PostgreSQL stopped at once during acknowledged writes, down for 30 s, then back', () => {
  it('keeps every acknowledged reading, answers 503 quickly while down, and recovers by itself', async () => {
    const acknowledged: number[] = [];
    for (let i = 0; i < 40; i++) {
      const r = await post(i);
      if (r.status === 201) acknowledged.push(i);
    }
    expect(acknowledged).toHaveLength(40);
    const inFlight = post(1000);
    cluster.stopImmediate();
    const flight = await inFlight;
    if (flight.status < 300) acknowledged.push(1000); // it won the race: then it must be stored
    else expect(flight.status).toBeGreaterThanOrEqual(500);

    const downSince = Date.now();
    const latencies: number[] = [];
    while (Date.now() - downSince < 30_000) {
      const t0 = Date.now();
      const health = await request(app).get('/api/health');
      const write = await post(2000 + latencies.length);
      latencies.push(Date.now() - t0);
      expect(health.status).toBe(503);
      expect(write.status).toBe(503);
      expect(write.body.code).toBe('service_unavailable');
      await new Promise((r) => setTimeout(r, 1000));
    }
    expect(Math.max(...latencies)).toBeLessThan(6000); // health + write each within the 2 s connect timeout

    cluster.start();
    let back = false;
    for (let k = 0; k < 30 && !back; k++) {
      back = (await request(app).get('/api/health')).status === 200;
      if (!back) await new Promise((r) => setTimeout(r, 500));
    }
    expect(back).toBe(true);
    const stored: Array<{ idempotency_key: string }> = await ds.query(`SELECT idempotency_key FROM reading WHERE piece_id = $1`, [pieceId]);
    const keys = new Set(stored.map((s) => s.idempotency_key));
    for (const i of acknowledged) expect(keys.has(`fault-key-${i}`), `acknowledged fault-key-${i}`).toBe(true);
    expect([...keys].some((k) => /^fault-key-2\d{3}$/.test(k))).toBe(false); // nothing answered 503 was stored
    expect((await post(3000)).status).toBe(201);
  });
});
