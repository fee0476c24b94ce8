import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { hashPassword } from '#server/auth/password';
import { faultPlant, migratedCluster, type Cluster } from './cluster';
import { exited, killLeftovers, startServerProcess } from './server-process';

// The server as a real process: SIGTERM while a long import commits, and SIGKILL in the middle of one.
const PORT = 5196;
let cluster: Cluster;
let ds: DataSource;

beforeAll(async () => {
  ({ cluster, ds } = await migratedCluster(54342, 2));
  const plant = await faultPlant(ds, { tag: 'S', email: 's@s.example', role: 'engineer', passwordHash: await hashPassword('signal password 1', 10) });
  for (let i = 0; i < 50; i++) await ds.query(`INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date) VALUES ($1, $2, $3, $4, '2025-01-01', '2025-01-02')`, [plant.plantId, plant.jobId, plant.designId, `S-${i}`]);
});
afterAll(async () => {
  killLeftovers(); // never leave a server behind
  await ds?.destroy().catch(() => undefined);
  cluster?.destroy();
});

const startServer = (): Promise<ChildProcess> => startServerProcess(PORT, cluster.url);

async function session(): Promise<{ cookie: string; csrf: string }> {
  const r = await fetch(`http://127.0.0.1:${PORT}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: 's@s.example', password: 'signal password 1' }) });
  const cookies = r.headers.getSetCookie();
  return { cookie: cookies.map((c) => c.split(';')[0]).join('; '), csrf: /cw_csrf=([^;]+)/.exec(cookies.join(';'))![1]! };
}

async function upload(s: { cookie: string; csrf: string }, run: number): Promise<{ id: string; proposedMapping: Record<string, string | null> }> {
  const lines = ['mark,date,camber'];
  for (let i = 0; i < 100_000; i++) lines.push(`S-${i % 50},${new Date(Date.UTC(2025, run * 3, 1, 12) + Math.floor(i / 50) * 60_000).toISOString().slice(0, 16).replace('T', ' ')},1 1/8`);
  const form = new FormData();
  form.append('kind', 'readings');
  form.append('file', new Blob([`${lines.join('\n')}\n`]), `run-${run}.csv`);
  const r = await fetch(`http://127.0.0.1:${PORT}/api/imports`, { method: 'POST', headers: { Cookie: s.cookie, 'X-CSRF-Token': s.csrf }, body: form });
  return r.json() as Promise<{ id: string; proposedMapping: Record<string, string | null> }>;
}

const commit = (s: { cookie: string; csrf: string }, imp: { id: string; proposedMapping: Record<string, string | null> }) =>
  fetch(`http://127.0.0.1:${PORT}/api/imports/${imp.id}/commit`, { method: 'POST', headers: { Cookie: s.cookie, 'X-CSRF-Token': s.csrf, 'Content-Type': 'application/json' }, body: JSON.stringify({ mapping: imp.proposedMapping }) });

const rows = async (id: string): Promise<number> => (await ds.query(`SELECT count(*)::int AS n FROM reading WHERE idempotency_key LIKE $1`, [`import:${id}:%`]))[0].n;

describe('signals to the server process', () => {
  it('SIGTERM during a 100,000-row import: the request completes, then the process exits 0', async () => {
    const child = await startServer();
    const s = await session();
    const imp = await upload(s, 0);
    const pending = commit(s, imp);
    await new Promise((r) => setTimeout(r, 300));
    const exit = exited(child);
    child.kill('SIGTERM');
    const res = await pending;
    expect(res.status).toBe(200);
    expect(((await res.json()) as { result: { added: number } }).result.added).toBe(100_000);
    expect(await exit).toBe(0);
    expect(await rows(imp.id)).toBe(100_000);
  });

  it('SIGKILL in the middle of an import: nothing of it is stored, and the same commit again completes once', async () => {
    let child = await startServer();
    const s = await session();
    const imp = await upload(s, 1);
    const pending = commit(s, imp).catch(() => null);
    // Kill it while the rows are being written.
    for (let k = 0; k < 400; k++) {
      // The commit has checked the rows and is writing them: its transaction holds the duplicate query.
      const act: Array<{ state: string; q: string }> = await ds.query(`SELECT state, left(query, 40) AS q FROM pg_stat_activity WHERE datname = 'fault' AND pid <> pg_backend_pid()`);
      const n = act.filter((a) => a.state.includes('transaction') || a.q.startsWith('INSERT INTO reading')).length;
      if (n > 0) break;
      await new Promise((r) => setTimeout(r, 25));
    }
    child.kill('SIGKILL');
    await pending;
    const [state] = await ds.query(`SELECT status FROM csv_import WHERE id = $1`, [imp.id]);
    expect(state.status).not.toBe('committed');
    expect(await rows(imp.id)).toBe(0); // never partial: the commit is one transaction
    child = await startServer();
    const s2 = await session();
    const again = await upload(s2, 1); // the same file: the first import answers
    expect(again.id).toBe(imp.id);
    const res = await commit(s2, again);
    expect(((await res.json()) as { result: { added: number } }).result.added).toBe(100_000);
    expect(await rows(imp.id)).toBe(100_000);
    const exit = exited(child);
    child.kill('SIGTERM');
    expect(await exit).toBe(0);
  });
});
