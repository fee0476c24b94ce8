import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { pieceDetailSchema } from '#shared/api/piece-detail';
import { piecePageSchema } from '#shared/api/pieces';
import { isLikelyDistorted } from '#shared/api/readings';
import { readingById } from '#server/readings/readings.repository';
import { buildDesign, buildJob, buildPiece, buildPlant, buildReading, buildUser, PASSWORD } from '../helpers/factories';

let t: TestApp;
let engineer: Session;
let viewer: Session;
let jobA: string;
beforeAll(async () => {
  t = await testApp();
  const plant = await buildPlant(t.ds);
  jobA = (await buildJob(t.ds, plant.id)).id;
  const jobB = (await buildJob(t.ds, plant.id)).id;
  const dt = (await buildDesign(t.ds, plant.id, 'DT28-60')).id;
  const hc = (await buildDesign(t.ds, plant.id, 'HC8-30')).id;
  for (const [mark, job, design, status, cast] of [
    ['DT-104', jobA, dt, 'in_storage', '2026-10-03'], ['DT-105', jobA, dt, 'hold', '2026-10-01'], ['DT 110', jobB, dt, 'shipped', '2026-09-01'],
    ['HC-201', jobB, hc, 'in_storage', '2026-10-02'], ['HC-202', jobB, hc, 'in_storage', '2026-10-05'],
  ] as const) await buildPiece(t.ds, plant.id, { mark, jobId: job, designId: design, status, castDate: cast });
  const e = await buildUser(t.ds, plant.id, 'engineer');
  const v = await buildUser(t.ds, plant.id, 'viewer', { jobId: jobA });
  engineer = await signIn(t.app, e.email, PASSWORD);
  viewer = await signIn(t.app, v.email, PASSWORD);
});
afterAll(() => t.close());

const marks = (body: { items: Array<{ mark: string }> }): string[] => body.items.map((i) => i.mark);

describe('GET /api/pieces', () => {
  it('when searching by mark, then spaces, dashes and case do not matter', async () => {
    expect(marks((await engineer.agent.get('/api/pieces?q=dt104')).body)).toEqual(['DT-104']);
    expect(marks((await engineer.agent.get('/api/pieces?q=DT-110')).body)).toEqual(['DT 110']);
    expect(marks((await engineer.agent.get('/api/pieces?q=hc 20')).body)).toEqual(['HC-201', 'HC-202']);
  });
  it('when filtering by status, product type and job, then only matching pieces come back', async () => {
    expect(marks((await engineer.agent.get('/api/pieces?status=hold')).body)).toEqual(['DT-105']);
    expect(marks((await engineer.agent.get('/api/pieces?productType=hollow-core')).body)).toEqual(['HC-201', 'HC-202']);
    expect(marks((await engineer.agent.get(`/api/pieces?jobId=${jobA}`)).body)).toEqual(['DT-104', 'DT-105']);
  });
  it('when sorting and paging, then the server orders and counts', async () => {
    const res = await engineer.agent.get('/api/pieces?sort=castDate&dir=desc&pageSize=2&page=1');
    expect(marks(res.body)).toEqual(['HC-202', 'DT-104']);
    expect(res.body.total).toBe(5);
    expect(piecePageSchema.parse(res.body)).toMatchObject({ page: 1, pageSize: 2 });
    const p3 = await engineer.agent.get('/api/pieces?sort=castDate&dir=desc&pageSize=2&page=3');
    expect(marks(p3.body)).toEqual(['DT 110']);
  });
  it('when the query is malformed, then 400 names the query field', async () => {
    const res = await engineer.agent.get('/api/pieces?pageSize=5000&sort=colour');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fieldErrors)).toEqual(expect.arrayContaining(['query.pageSize', 'query.sort']));
  });
  it('when a viewer lists pieces, then only the pieces of their job come back', async () => {
    expect(marks((await viewer.agent.get('/api/pieces')).body)).toEqual(['DT-104', 'DT-105']);
    const jobs = (await viewer.agent.get('/api/jobs')).body as Array<{ id: string }>;
    expect(jobs.map((j) => j.id)).toEqual([jobA]);
  });
});

describe('GET /api/pieces/:id', () => {
  it('when a piece has readings and decisions, then the page matches the shared contract and lists them newest first', async () => {
    const plant = await buildPlant(t.ds);
    const qc = await buildUser(t.ds, plant.id, 'qc_manager');
    const piece = await buildPiece(t.ds, plant.id, { mark: 'DT-900' });
    await buildReading(t.ds, plant.id, piece.id, qc.id, { valueMm: 31.75, takenAt: '2026-10-10T14:00:00Z' });
    await buildReading(t.ds, plant.id, piece.id, qc.id, { valueMm: 33.3375, takenAt: '2026-10-20T14:00:00Z', sky: 'sun' });
    await t.ds.query(`INSERT INTO decision (plant_id, piece_id, kind, comment, decided_by, decided_at) VALUES ($1, $2, 'hold', 'wait', $3, '2026-10-21T09:00:00Z')`, [plant.id, piece.id, qc.id]);
    const s = await signIn(t.app, qc.email, PASSWORD);
    const res = await s.agent.get(`/api/pieces/${piece.id}`);
    expect(res.status).toBe(200);
    const page = pieceDetailSchema.parse(res.body);
    expect(page.piece.mark).toBe('DT-900');
    expect(page.piece.latestReading).toEqual({ valueMm: 33.3375, takenAt: '2026-10-20T14:00:00.000Z' });
    expect(page.readings.map((r) => [r.takenAt, r.valueMm])).toEqual([['2026-10-20T14:00:00.000Z', 33.3375], ['2026-10-10T14:00:00.000Z', 31.75]]);
    expect(page.readings.map((r) => r.takenBy)).toEqual([expect.any(String), expect.any(String)]);
    expect(page.decisions).toEqual([{ id: expect.any(String), kind: 'hold', comment: 'wait', decidedBy: expect.any(String), decidedAt: '2026-10-21T09:00:00.000Z' }]);
    expect(page.design.productType).toBe('double-tee');
    // The page describes each reading as the reading lookup does (one mapping, two queries).
    for (const r of page.readings) expect(r).toEqual(await readingById(t.ds, r.id));
  });

  it('when readings in afternoon sun are on the page, then each is marked by the shared rule on the plant clock', async () => {
    const plant = await buildPlant(t.ds); // America/Chicago
    const qc = await buildUser(t.ds, plant.id, 'qc_manager');
    const piece = await buildPiece(t.ds, plant.id, { mark: 'DT-901' });
    // Every hour of one November day (UTC−6), in sun and in shade; the SQL on the page must agree with
    // isLikelyDistorted applied to the hour that the Intl clock of the plant's zone gives.
    const hourOf = new Intl.DateTimeFormat('en-GB', { hour: 'numeric', hourCycle: 'h23', timeZone: 'America/Chicago' });
    const expected = new Map<string, boolean>();
    for (let h = 0; h < 24; h++) {
      for (const sky of ['sun-on-top', 'overcast']) {
        const takenAt = new Date(Date.UTC(2026, 10, 20, h, sky === 'overcast' ? 30 : 0));
        const { id } = await buildReading(t.ds, plant.id, piece.id, qc.id, { takenAt: takenAt.toISOString(), sky });
        expected.set(id, isLikelyDistorted(sky, Number(hourOf.format(takenAt))));
      }
    }
    const s = await signIn(t.app, qc.email, PASSWORD);
    const page = pieceDetailSchema.parse((await s.agent.get(`/api/pieces/${piece.id}`)).body);
    expect(page.readings).toHaveLength(48);
    expect(new Map(page.readings.map((r) => [r.id, r.likelyDistorted]))).toEqual(expected);
    expect(page.readings.filter((r) => r.likelyDistorted).map((r) => r.takenAt).sort()).toEqual(
      // 12:00–18:59 in Chicago is 18:00–00:59 UTC: 18–23 h of this day, and 00 h (18 h of the day before).
      ['00', '18', '19', '20', '21', '22', '23'].map((h) => `2026-11-20T${h}:00:00.000Z`),
    );
  });

  it('when a piece has no readings or decisions, then the page has empty lists and no latest reading', async () => {
    const plant = await buildPlant(t.ds);
    const qc = await buildUser(t.ds, plant.id, 'qc_manager');
    const piece = await buildPiece(t.ds, plant.id, { mark: 'DT-902' });
    const s = await signIn(t.app, qc.email, PASSWORD);
    const res = await s.agent.get(`/api/pieces/${piece.id}`);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    const page = pieceDetailSchema.parse(res.body);
    expect([page.readings, page.decisions, page.piece.latestReading, page.piece.bay, page.piece.bayPosition]).toEqual([[], [], null, null, null]);
    expect(page.piece.version).toBe(1);
  });
});
