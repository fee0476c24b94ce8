// `npm run bench:api`: the review list, the piece page and the reading POST on a plant-sized dataset
// (50,000 pieces, 1,000,000 readings), beside a bare Express 5 + pg route running one indexed single-piece
// query on the same database, in the same run (autocannon; ratios, since machines here are noisy).
import type { AddressInfo } from 'node:net';
import autocannon from 'autocannon';
import express from 'express';
import pg from 'pg';
import pino from 'pino';
import { createApp } from '../app';
import { cachedSessionUsers } from '../auth/session-users';
import { createDataSource } from '../db/data-source';
import { keptPages } from '../db/kept-pages';
import { createMailer } from '../mail/mailer';
import { freshBenchDatabase, makeDataset } from './dataset';
import { median, spread } from './stats';

type Result = { rps: number; p99: number; non2xx: number; errors: number; ok: number };

function run(url: string, o: { connections: number; duration: number; headers?: Record<string, string>; method?: string; body?: (i: number) => string; path?: (i: number) => string; before?: () => void }): Promise<Result> {
  let i = 0;
  return new Promise((resolve, reject) => {
    autocannon(
      {
        url,
        connections: o.connections,
        duration: o.duration,
        headers: o.headers,
        requests: [{ method: (o.method ?? 'GET') as 'GET', setupRequest: (req) => {
          o.before?.();
          const n = i++;
          return { ...req, path: o.path ? o.path(n) : req.path, body: o.body ? o.body(n) : undefined, headers: { ...req.headers, ...(o.body ? { 'Idempotency-Key': `bench-post-${Date.now()}-${n}` } : {}) } };
        } }],
      },
      (err, r) => (err ? reject(err) : resolve({ rps: r.requests.average, p99: r.latency.p99, non2xx: r.non2xx, errors: r.errors, ok: r['2xx'] })),
    );
  });
}

async function main(): Promise<void> {
  const cfg0 = await freshBenchDatabase();
  const ds = createDataSource(cfg0.databaseUrl, 10);
  await ds.initialize();
  const t0 = Date.now();
  const data = await makeDataset(ds);
  console.log(`dataset: 50,000 pieces, 1,000,000 readings, projections and flags made in ${((Date.now() - t0) / 1000).toFixed(1)} s`);

  // As the server runs: signed-in users kept in memory while their changes are listened for.
  const log = pino({ level: 'silent' });
  const sessions = await cachedSessionUsers(ds, cfg0.databaseUrl, log);
  const ours = createApp({ ds, cfg: cfg0, mailer: createMailer(cfg0), log, sessions }, null).listen(0, '127.0.0.1');
  const pool = new pg.Pool({ connectionString: cfg0.databaseUrl, max: 10 });
  const bare = express();
  bare.get('/bare/:id', async (req, res) => res.json((await pool.query('SELECT * FROM piece WHERE id = $1', [req.params.id])).rows[0]));
  const bareServer = bare.listen(0, '127.0.0.1');
  await new Promise((r) => setTimeout(r, 200));
  const oursUrl = `http://127.0.0.1:${(ours.address() as AddressInfo).port}`;
  const bareUrl = `http://127.0.0.1:${(bareServer.address() as AddressInfo).port}`;
  const login = await fetch(`${oursUrl}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: data.engineerEmail, password: data.password }) });
  const cookies = login.headers.getSetCookie();
  const headers = { Cookie: cookies.map((c) => c.split(';')[0]).join('; '), 'X-CSRF-Token': /cw_csrf=([^;]+)/.exec(cookies.join(';'))![1]!, 'Content-Type': 'application/json' };
  const ids = data.pieceIds;
  // Every piece of the plant in a scrambled order: more pages than the server keeps, so each is built.
  const allIds: string[] = (await ds.query(`SELECT id FROM piece WHERE plant_id = $1 ORDER BY md5(id::text)`, [data.plantId])).map((r: { id: string }) => r.id);

  // Rounds of the anchor and each list in turn, so a slow moment of the machine hits them alike; the
  // figures are medians over the rounds with their spread, and each round's ratio is to its own anchor.
  const rounds = Number(process.env.BENCH_ROUNDS ?? 3);
  const GETS = {
    anchor: { name: 'anchor: bare Express + pg by id', url: bareUrl, headers: {}, path: (i: number) => `/bare/${ids[i % ids.length]}` },
    review: { name: 'review list (50 flagged pieces, kept)', url: `${oursUrl}/api/review?view=all-flagged&pageSize=50`, headers, path: undefined },
    // The same list with the server's kept pages dropped before each request, as after a change each time.
    reviewBuilt: { name: 'review list, built for each request', url: `${oursUrl}/api/review?view=all-flagged&pageSize=50`, headers, path: undefined, before: () => keptPages(ds, 'review').clear() },
    piece: { name: 'piece page (1,000 pieces in turn)', url: oursUrl, headers, path: (i: number) => `/api/pieces/${ids[i % ids.length]}` },
    pieceFirst: { name: 'piece page, first view (50,000 in turn)', url: oursUrl, headers, path: (i: number) => `/api/pieces/${allIds[i % allIds.length]}` },
    list: { name: 'piece list (50 of 50,000, latest reading)', url: `${oursUrl}/api/pieces?sort=shipDate&pageSize=50`, headers, path: undefined },
  };
  const results: Record<keyof typeof GETS, Result[]> = { anchor: [], review: [], reviewBuilt: [], piece: [], pieceFirst: [], list: [] };
  for (let r = 0; r < rounds; r++) {
    for (const key of Object.keys(GETS) as Array<keyof typeof GETS>) {
      const g: { url: string; headers: Record<string, string>; path?: (i: number) => string; before?: () => void } = GETS[key];
      results[key].push(await run(g.url, { connections: 10, duration: 10, headers: g.headers, path: g.path, before: g.before }));
    }
  }
  const before = Number((await ds.query(`SELECT count(*) FROM reading WHERE request_hash <> 'bench'`))[0].count);
  const post = await run(`${oursUrl}/api/readings`, {
    connections: 20, duration: 10, headers, method: 'POST',
    body: (i) => JSON.stringify({ pieceId: ids[i % ids.length], value: '1 3/8', unit: 'in', takenAt: new Date(Date.UTC(2026, 9, 1) + i * 1000).toISOString(), method: 'level', support: 'dunnage' }),
  });
  const after = Number((await ds.query(`SELECT count(*) FROM reading WHERE request_hash <> 'bench'`))[0].count);

  const line = (name: string, r: Result): string => `${name.padEnd(42)} ${Math.round(r.rps).toString().padStart(6)} req/s   p99 ${String(r.p99).padStart(4)} ms   non-2xx ${r.non2xx}, errors ${r.errors}`;
  console.log(`medians of ${rounds} rounds of 10 s, spread in brackets`);
  for (const key of Object.keys(GETS) as Array<keyof typeof GETS>) {
    const rs = results[key];
    const rps = rs.map((x) => x.rps);
    const p99 = rs.map((x) => x.p99);
    let text = `${GETS[key].name.padEnd(42)} ${Math.round(median(rps)).toString().padStart(6)} req/s [${spread(rps)}]   p99 ${median(p99)} ms [${spread(p99)}]   non-2xx ${rs.reduce((n, x) => n + x.non2xx, 0)}, errors ${rs.reduce((n, x) => n + x.errors, 0)}`;
    if (key !== 'anchor') {
      const ratios = rs.map((x, i) => x.rps / results.anchor[i]!.rps);
      const p99s = rs.map((x, i) => x.p99 / Math.max(1, results.anchor[i]!.p99));
      text += `   ratio ${median(ratios).toFixed(2)} [${spread(ratios, 2)}] req/s, ${median(p99s).toFixed(1)}× [${spread(p99s, 1)}] p99`;
    }
    console.log(text);
  }
  const [{ doubled }] = await ds.query(`SELECT count(*) - count(DISTINCT idempotency_key) AS doubled FROM reading WHERE request_hash <> 'bench'`);
  // Requests still in flight when the clock stops are stored but not counted by autocannon: rows ≥ acknowledged.
  console.log(`${line('reading POST, 20 connections', post)}   rows ${after - before} ≥ acknowledged ${post.ok}: ${after - before >= post.ok ? 'none lost' : 'LOST'}; doubled keys ${doubled}`);
  console.log('targets: lists ≥ 0.5 of the anchor req/s and p99 ≤ 2×; reading POST p99 < 200 ms with nothing lost or doubled');
  ours.close();
  bareServer.close();
  await pool.end();
  await sessions.close();
  await ds.destroy();
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
