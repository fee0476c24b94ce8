// `npm run bench:soak`: ten minutes at 50 requests/s of mixed reads and writes (review list, piece page,
// piece search, reading POST with its projection job) against the server and its job workers in this
// process, sampling every 30 s the heap after a full collection, the connection pool and the open
// handles. They should stay flat: a leak shows as a steady climb from the first samples to the last.
// SOAK_SECONDS and SOAK_RATE change the length and the rate; SOAK_PIECES the dataset.
import type { AddressInfo } from 'node:net';
import autocannon, { type Result } from 'autocannon';
import type pg from 'pg';
import pino from 'pino';
import type { PostgresDriver } from 'typeorm/driver/postgres/PostgresDriver.js';
import { createApp } from '../app';
import { cachedSessionUsers } from '../auth/session-users';
import { createDataSource } from '../db/data-source';
import { createJobs } from '../jobs/queue';
import { createMailer } from '../mail/mailer';
import { keptSize } from '../db/kept-pages';
import { freshBenchDatabase, makeDataset } from './dataset';
import { median } from './stats';

const SECONDS = Number(process.env.SOAK_SECONDS ?? 600);
const RATE = Number(process.env.SOAK_RATE ?? 50);
const SAMPLE_EVERY_S = Math.min(30, Math.max(5, Math.floor(SECONDS / 10)));

interface Sample { atS: number; heapMb: number; keptMb: number; rssMb: number; poolTotal: number; poolIdle: number; poolWaiting: number; handles: number }

const gc = (globalThis as { gc?: () => void }).gc;

async function main(): Promise<void> {
  if (!gc) throw new Error('run with node --expose-gc (npm run bench:soak does)');
  const cfg = { ...(await freshBenchDatabase()), PROJECTION_DELAY_SECONDS: 1, ALERT_DIGEST_SECONDS: 3600 };
  const ds = createDataSource(cfg.databaseUrl, 10);
  await ds.initialize();
  const data = await makeDataset(ds, Number(process.env.SOAK_PIECES ?? 5_000));
  const log = pino({ level: 'silent' });
  const deps = { ds, cfg, mailer: createMailer(cfg), log, sessions: await cachedSessionUsers(ds, cfg.databaseUrl, log) };
  const jobs = await createJobs(deps, { schedule: false });
  await jobs.startWorkers();
  const server = createApp({ ...deps, jobs }, null).listen(0, '127.0.0.1');
  await new Promise((r) => setTimeout(r, 200));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const login = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: data.engineerEmail, password: data.password }) });
  const cookies = login.headers.getSetCookie();
  const headers = { Cookie: cookies.map((c) => c.split(';')[0]).join('; '), 'X-CSRF-Token': /cw_csrf=([^;]+)/.exec(cookies.join(';'))![1]!, 'Content-Type': 'application/json' };
  const ids = data.pieceIds;
  const pool = (ds.driver as PostgresDriver).master as pg.Pool;

  const samples: Sample[] = [];
  const t0 = Date.now();
  const sample = (): void => {
    gc();
    const m = process.memoryUsage();
    samples.push({
      atS: Math.round((Date.now() - t0) / 1000), heapMb: m.heapUsed / 2 ** 20, rssMb: m.rss / 2 ** 20, keptMb: keptSize(ds) / 2 ** 20,
      poolTotal: pool.totalCount, poolIdle: pool.idleCount, poolWaiting: pool.waitingCount, handles: process.getActiveResourcesInfo().length,
    });
    const s = samples.at(-1)!;
    console.log(`${String(s.atS).padStart(5)} s   heap ${s.heapMb.toFixed(1).padStart(6)} MB (kept pages ${s.keptMb.toFixed(1)} MB)   rss ${s.rssMb.toFixed(0).padStart(4)} MB   pool ${s.poolTotal} open, ${s.poolIdle} idle, ${s.poolWaiting} waiting   handles ${s.handles}`);
  };
  const timer = setInterval(sample, SAMPLE_EVERY_S * 1000);
  sample();

  let n = 0;
  // A mix as the plant uses it: mostly reads, one write in five (a reading, which queues a projection).
  const result = await new Promise<Result>((resolve, reject) => autocannon({
    url,
    connections: 10,
    overallRate: RATE,
    duration: SECONDS,
    headers,
    requests: [
      { method: 'GET', setupRequest: (r) => ({ ...r, path: '/api/review?view=all-flagged&pageSize=50' }) },
      { method: 'GET', setupRequest: (r) => ({ ...r, path: `/api/pieces/${ids[n++ % ids.length]}` }) },
      { method: 'GET', setupRequest: (r) => ({ ...r, path: `/api/pieces?q=B-${n % 500}&pageSize=25` }) },
      { method: 'GET', setupRequest: (r) => ({ ...r, path: `/api/pieces/${ids[n++ % ids.length]}` }) },
      {
        method: 'POST',
        setupRequest: (r) => {
          const i = n++;
          const body = JSON.stringify({ pieceId: ids[i % ids.length], value: '1 3/8', unit: 'in', takenAt: new Date(Date.UTC(2026, 9, 1) + i * 1000).toISOString(), method: 'level', support: 'dunnage' });
          return { ...r, path: '/api/readings', body, headers: { ...r.headers, 'Idempotency-Key': `soak-${t0}-${i}` } };
        },
      },
    ],
  }, (err, r) => (err ? reject(err) : resolve(r))));
  clearInterval(timer);
  sample();

  const third = Math.max(1, Math.floor(samples.length / 3));
  const first = samples.slice(1, 1 + third); // the first sample is before any traffic
  const last = samples.slice(-third);
  const heapGrowth = median(last.map((s) => s.heapMb)) - median(first.map((s) => s.heapMb));
  // Kept piece pages are bounded (16 million characters) and grow with the readings the soak adds to
  // them; what must stay flat is the rest of the heap.
  const restGrowth = median(last.map((s) => s.heapMb - s.keptMb)) - median(first.map((s) => s.heapMb - s.keptMb));
  // Pool sockets come and go with the pool's idle timeout; the handles beside them are what must not grow.
  const others = (s: Sample): number => s.handles - s.poolTotal;
  const handleGrowth = median(last.map(others)) - median(first.map(others));
  const end = samples.at(-1)!;
  console.log(`\n${result.requests.total} requests in ${SECONDS} s (${result.requests.average.toFixed(1)}/s), non-2xx ${result.non2xx}, errors ${result.errors}, p99 ${result.latency.p99} ms`);
  const signed = (v: number): string => `${v >= 0 ? '+' : ''}${v.toFixed(1)} MB`;
  console.log(`heap after GC, median of the first third → last third of the samples: ${signed(heapGrowth)}; besides the kept pages: ${signed(restGrowth)}`);
  console.log(`open handles besides pool connections, the same medians: ${handleGrowth >= 0 ? '+' : ''}${handleGrowth}; pool at the end: ${end.poolTotal} open, ${end.poolWaiting} waiting`);
  console.log('flat means: the heap besides kept pages grows by at most 5 MB, other handles by at most 2, nobody waiting for a connection');
  console.log(`verdict: ${restGrowth <= 5 && handleGrowth <= 2 && end.poolWaiting === 0 ? 'flat' : 'NOT flat'}`);

  server.close();
  await jobs.stop();
  await deps.sessions.close();
  await ds.destroy();
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
