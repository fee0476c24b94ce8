import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DESIGNS } from '#seed/designs';
import { runProjection } from '#server/projections/projection.service';
import type { Session, TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildReading } from '../helpers/factories';

let t: TestApp;
let plant: PlantWithUsers;
let eng: Session;
beforeAll(async () => ({ t, plant, session: eng } = await appWithPlant('engineer')));
afterAll(() => t.close());

const spec = DEMO_DESIGNS.find((x) => x.code === 'DT28-60')!.spec;
const post = (path: string, body: object) => eng.agent.post(path).set('X-CSRF-Token', eng.csrf).send(body);

describe('member designs and the piece schedule', () => {
  it('when a design used by pieces is edited, then a new version is made and the pieces keep their prediction until re-assigned', async () => {
    const created = await post('/api/designs', { code: `V-${Date.now()}`, name: 'Versioned tee', spec });
    expect(created.status).toBe(201);
    const job = await post('/api/jobs', { number: `JV-${Date.now()}`, name: 'Versioning job' });
    const pieces = await post('/api/pieces/bulk', { jobId: job.body.id, designId: created.body.id, markPattern: 'VT-{n}', start: 1, count: 2, castDate: '2026-10-01', shipDate: '2026-12-20' });
    expect(pieces.status).toBe(201);
    const [p1] = pieces.body.created as string[];
    await buildReading(t.ds, plant.plantId, p1!, plant.users.inspector.id, { valueMm: 40, takenAt: '2026-10-20T13:00:00Z' });
    await runProjection(t.deps, p1!);
    const before = (await t.ds.query(`SELECT ship_mm FROM projection WHERE piece_id = $1`, [p1]))[0].ship_mm;
    // More strands: a stiffer prestress, a higher camber.
    const edited = await eng.agent.put(`/api/designs/${created.body.id}`).set('X-CSRF-Token', eng.csrf).send({ name: 'Versioned tee', spec: { ...spec, strands: [{ count: 24, area: 0.153, profile: 'harped-1', eccEnd: 4, eccMid: 16.5 }] } });
    expect(edited.status).toBe(200);
    expect(edited.body.version).toBe(2);
    expect(edited.body.id).not.toBe(created.body.id);
    await runProjection(t.deps, p1!);
    expect((await t.ds.query(`SELECT ship_mm FROM projection WHERE piece_id = $1`, [p1]))[0].ship_mm).toBe(before);
    const moved = await post('/api/pieces/reassign', { pieceIds: [p1], designId: edited.body.id });
    expect(moved.body).toEqual({ moved: 1 });
    await runProjection(t.deps, p1!);
    expect(Number((await t.ds.query(`SELECT ship_mm FROM projection WHERE piece_id = $1`, [p1]))[0].ship_mm)).not.toBeCloseTo(Number(before), 3);
  });
  it('when a design no piece uses is edited, then it changes in place', async () => {
    const created = await post('/api/designs', { code: `U-${Date.now()}`, name: 'Unused', spec });
    const edited = await eng.agent.put(`/api/designs/${created.body.id}`).set('X-CSRF-Token', eng.csrf).send({ name: 'Unused, renamed', spec });
    expect(edited.body).toMatchObject({ id: created.body.id, version: 1, name: 'Unused, renamed' });
  });
  it('when the spec is not valid, then 400 names the field', async () => {
    const res = await post('/api/designs', { code: `B-${Date.now()}`, name: 'Bad', spec: { ...spec, strands: [{ count: 10, area: 0.153, profile: 'harped-2', eccEnd: 4, eccMid: 13 }] } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fieldErrors)).toContain('spec.strands.0.harpAt');
  });
  it('when bulk marks already exist in the job, then 409 names them and nothing is added', async () => {
    const job = await post('/api/jobs', { number: `JB-${Date.now()}`, name: 'Bulk job' });
    const designId = (await t.ds.query(`SELECT design_id FROM piece WHERE id = $1`, [plant.piece.id]))[0].design_id;
    await post('/api/pieces/bulk', { jobId: job.body.id, designId, markPattern: 'B-{n}', start: 1, count: 3, castDate: '2026-10-01' });
    const again = await post('/api/pieces/bulk', { jobId: job.body.id, designId, markPattern: 'B-{n}', start: 3, count: 3, castDate: '2026-10-01' });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/B-3/);
    expect((await t.ds.query(`SELECT count(*)::int AS n FROM piece WHERE job_id = $1`, [job.body.id]))[0].n).toBe(3);
  });
});
