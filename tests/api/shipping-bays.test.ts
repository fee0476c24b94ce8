import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runProjection } from '#server/projections/projection.service';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildDesign, buildJob, buildPiece, buildPlantWithUsers, buildReading, buildUser, PASSWORD } from '../helpers/factories';

let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let qc: Session;
let engineer: Session;
let jobId: string;
let designId: string;
beforeAll(async () => {
  t = await testApp();
  plant = await buildPlantWithUsers(t.ds);
  qc = await signIn(t.app, plant.users.qc_manager.email, PASSWORD);
  engineer = await signIn(t.app, plant.users.engineer.email, PASSWORD);
  jobId = (await buildJob(t.ds, plant.plantId)).id;
  designId = (await buildDesign(t.ds, plant.plantId, 'DT28-60')).id;
});
afterAll(() => t.close());

const DAY = 86_400_000;
const day = (offset: number): string => new Date(Date.now() + offset * DAY).toISOString().slice(0, 10);

/** A piece with one reading (in mm) of the given age, projected. */
async function projectedPiece(mark: string, mm: number, o: { bay?: string; position?: number; shipIn?: number; readingDaysAgo?: number; status?: string } = {}) {
  const p = await buildPiece(t.ds, plant.plantId, { jobId, designId, mark, castDate: day(-40), status: o.status });
  await t.ds.query(`UPDATE piece SET ship_date = $2, erection_date = $3, bay = $4, bay_position = $5 WHERE id = $1`, [p.id, day(o.shipIn ?? 2), day((o.shipIn ?? 2) + 1), o.bay ?? null, o.position ?? null]);
  await buildReading(t.ds, plant.plantId, p.id, plant.users.inspector.id, { valueMm: mm, takenAt: new Date(Date.now() - (o.readingDaysAgo ?? 1) * DAY).toISOString() });
  await runProjection(t.deps, p.id);
  return p;
}

describe('bay matching through the API', () => {
  it('when an engineer asks for a bay, then the proposal takes the best-matched pieces from the yard; accepting it sets the positions, audited', async () => {
    const a = await projectedPiece('B-1', 50, { bay: 'Bay A', position: 1 });
    const b = await projectedPiece('B-2', 80, { bay: 'Bay A', position: 2 }); // far from the others
    const c = await projectedPiece('B-3', 52, { bay: 'Bay A', position: 3 });
    const spare = await projectedPiece('B-4', 51); // interchangeable, in the yard
    const res = await engineer.agent.get(`/api/bays/detail?jobId=${jobId}&bay=${encodeURIComponent('Bay A')}`);
    expect(res.status).toBe(200);
    expect(res.body.positions).toBe(3);
    expect(res.body.current.map((p: { mark: string }) => p.mark)).toEqual(['B-1', 'B-2', 'B-3']);
    expect(res.body.proposal.feasible).toBe(true);
    expect(res.body.proposal.order).toHaveLength(3);
    expect(res.body.proposal.order).not.toContain(b.id);
    expect(res.body.proposal.order).toContain(spare.id);
    const accept = await engineer.agent.post('/api/bays/arrange').set('X-CSRF-Token', engineer.csrf).send({ jobId, bay: 'Bay A', pieceIds: res.body.proposal.order });
    expect(accept.status).toBe(200);
    const rows = await t.ds.query(`SELECT id, bay, bay_position FROM piece WHERE id = ANY($1::uuid[]) ORDER BY bay_position NULLS LAST`, [[a.id, b.id, c.id, spare.id]]);
    expect(rows.filter((r: { bay: string | null }) => r.bay === 'Bay A').map((r: { id: string }) => r.id)).toEqual(res.body.proposal.order);
    expect(rows.find((r: { id: string }) => r.id === b.id).bay).toBeNull();
    const audit = await t.ds.query(`SELECT action FROM audit_event WHERE entity = 'bay' AND entity_id = $1`, [`${jobId}/Bay A`]);
    expect(audit).toEqual([{ action: 'arrange-bay' }]);
  });
  it('when a piece of another job is placed by hand, then 400 names it', async () => {
    const other = await buildPiece(t.ds, plant.plantId, { designId });
    const res = await engineer.agent.post('/api/bays/arrange').set('X-CSRF-Token', engineer.csrf).send({ jobId, bay: 'Bay A', pieceIds: [other.id] });
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.pieceIds[0]).toMatch(/not eligible/);
  });
  it('when an inspector tries to arrange a bay, then 403', async () => {
    const ins = await signIn(t.app, plant.users.inspector.email, PASSWORD);
    const res = await ins.agent.post('/api/bays/arrange').set('X-CSRF-Token', ins.csrf).send({ jobId, bay: 'Bay A', pieceIds: [plant.piece.id] });
    expect(res.status).toBe(403);
  });
});

describe('ship readiness, enforced on the server', () => {
  it('when a piece is ready, then QC marks it shipped and the audit says so', async () => {
    const p = await projectedPiece('S-1', 50, { shipIn: 0 });
    const list = await qc.agent.get(`/api/shipping?date=${day(0)}`);
    expect(list.body.rows.find((r: { pieceId: string }) => r.pieceId === p.id).blockers).toEqual([]);
    const res = await qc.agent.post('/api/shipping/ship').set('X-CSRF-Token', qc.csrf).send({ pieceIds: [p.id] });
    expect(res.status).toBe(200);
    expect((await t.ds.query(`SELECT status FROM piece WHERE id = $1`, [p.id]))[0].status).toBe('shipped');
  });
  it('when the last reading is too old or the piece is on hold, then it needs a QC override with a comment', async () => {
    const stale = await projectedPiece('S-2', 50, { shipIn: 0, readingDaysAgo: 30 });
    const held = await projectedPiece('S-3', 50, { shipIn: 0, status: 'hold' });
    const list = await qc.agent.get(`/api/shipping?date=${day(0)}`);
    const row = (id: string) => list.body.rows.find((r: { pieceId: string }) => r.pieceId === id);
    expect(row(stale.id).blockers).toContainEqual(expect.stringMatching(/last reading 30 days old/));
    expect(row(held.id).blockers).toContain('on hold');
    const bare = await qc.agent.post('/api/shipping/ship').set('X-CSRF-Token', qc.csrf).send({ pieceIds: [stale.id, held.id] });
    expect(bare.status).toBe(409);
    expect(bare.body.code).toBe('override_required');
    expect((await t.ds.query(`SELECT count(*)::int AS n FROM piece WHERE id = ANY($1::uuid[]) AND status = 'shipped'`, [[stale.id, held.id]]))[0].n).toBe(0);
    const admin = await signIn(t.app, plant.users.admin.email, PASSWORD);
    const byAdmin = await admin.agent.post('/api/shipping/ship').set('X-CSRF-Token', admin.csrf).send({ pieceIds: [stale.id], overrideComment: 'truck waiting' });
    expect(byAdmin.status).toBe(403);
    const ok = await qc.agent.post('/api/shipping/ship').set('X-CSRF-Token', qc.csrf).send({ pieceIds: [stale.id, held.id], overrideComment: 'measured on the truck, 1 3/8 in, fine' });
    expect(ok.status).toBe(200);
    const audits = await t.ds.query(`SELECT action, after->>'override' AS why FROM audit_event WHERE entity_id = $1`, [stale.id]);
    expect(audits).toEqual([{ action: 'ship-override', why: 'measured on the truck, 1 3/8 in, fine' }]);
  });
  it('when a piece is flagged without a decision, then it is blocked', async () => {
    const p = await projectedPiece('S-4', 200, { shipIn: 0 }); // far above tolerance
    const list = await qc.agent.get(`/api/shipping?date=${day(0)}`);
    expect(list.body.rows.find((r: { pieceId: string }) => r.pieceId === p.id).blockers).toContainEqual(expect.stringMatching(/flagged without a decision/));
  });
});

describe('viewer isolation', () => {
  it('when a viewer of job A asks for anything of job B, then 404, and every write is 403', async () => {
    const jobB = (await buildJob(t.ds, plant.plantId)).id;
    const pieceB = await buildPiece(t.ds, plant.plantId, { jobId: jobB, designId });
    const jobA = (await buildJob(t.ds, plant.plantId)).id;
    const pieceA = await buildPiece(t.ds, plant.plantId, { jobId: jobA, designId });
    const v = await buildUser(t.ds, plant.plantId, 'viewer', { jobId: jobA });
    const s = await signIn(t.app, v.email, PASSWORD);
    expect((await s.agent.get(`/api/pieces/${pieceA.id}`)).status).toBe(200);
    for (const path of [`/api/pieces/${pieceB.id}`, `/api/pieces/${pieceB.id}/projection`, `/api/reports/pieces/${pieceB.id}`]) {
      expect((await s.agent.get(path)).status, path).toBe(404);
    }
    expect((await s.agent.get(`/api/bays?jobId=${jobB}`)).body.every((b: { jobId: string }) => b.jobId === jobA)).toBe(true);
    const writes = [
      s.agent.post('/api/readings').set('X-CSRF-Token', s.csrf).set('Idempotency-Key', 'viewer-write-1').send({}),
      s.agent.post(`/api/pieces/${pieceA.id}/decisions`).set('X-CSRF-Token', s.csrf).send({ kind: 'accept', version: 1 }),
      s.agent.post('/api/bays/arrange').set('X-CSRF-Token', s.csrf).send({ jobId: jobA, bay: 'x', pieceIds: [pieceA.id] }),
      s.agent.post('/api/shipping/ship').set('X-CSRF-Token', s.csrf).send({ pieceIds: [pieceA.id] }),
    ];
    for (const w of await Promise.all(writes)) expect(w.status).toBe(403);
  });
});

describe('piece camber report (PDF)', () => {
  it('when a report is asked for, then its text has the exact fractions and symbols and a page renders to an image', async () => {
    const p = await projectedPiece('R-1', 34.925); // 1⅜ in
    await buildReading(t.ds, plant.plantId, p.id, plant.users.inspector.id, { valueMm: 9.525 }); // ⅜ in, far below: a negative difference
    await runProjection(t.deps, p.id);
    const res = await qc.agent.get(`/api/reports/pieces/${p.id}`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const dir = mkdtempSync(join(tmpdir(), 'cw-report-'));
    const file = join(dir, 'report.pdf');
    writeFileSync(file, res.body as Buffer);
    const text = execFileSync('pdftotext', ['-enc', 'UTF-8', file, '-']).toString('utf8');
    expect(text).toContain('Piece camber report — R-1');
    expect(text).toContain('1⅜″');
    expect(text).toContain('⅜″');
    expect(text).toContain('±');
    expect(text).toContain('−');
    expect(text).toContain('does not replace, the engineer of record');
    execFileSync('pdftoppm', ['-png', '-r', '50', '-f', '1', '-l', '1', file, join(dir, 'page')]);
    const png = readdirSync(dir).find((f) => f.endsWith('.png'))!;
    expect(statSync(join(dir, png)).size).toBeGreaterThan(5000);
  });
});
