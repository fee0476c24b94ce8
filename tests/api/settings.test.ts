import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultFamilySettings } from '#shared/api/settings';
import { runProjection } from '#server/projections/projection.service';
import { signIn, type Session, type TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildPiece, buildReading, PASSWORD } from '../helpers/factories';

let t: TestApp;
let plant: PlantWithUsers;
let eng: Session;
beforeAll(async () => ({ t, plant, session: eng } = await appWithPlant('engineer')));
afterAll(() => t.close());

const projection = async (pieceId: string) => (await t.ds.query(`SELECT tolerance_mm, growth_factor, readings_used FROM projection WHERE piece_id = $1`, [pieceId]))[0];

describe('/api/settings', () => {
  it('lists every product family with the reference defaults and their source', async () => {
    const res = await eng.agent.get('/api/settings');
    const dt = res.body.find((s: { productType: string }) => s.productType === 'double-tee');
    expect(dt.stored).toBe(false);
    expect(dt.settings.tolerance).toMatchObject({ ratePer10ft: 0.25, cap: 0.75, confidence: 'MEM-M' });
    expect(dt.settings.tolerance.source).toMatch(/MNL-135/);
  });
  it('when an engineer tightens the tolerance of a family, then projections use it, and the change is audited', async () => {
    const piece = plant.piece; // a double tee of the DT28-60 design
    await runProjection(t.deps, piece.id);
    expect(Number((await projection(piece.id)).tolerance_mm)).toBeCloseTo(19.05, 6); // ±3/4 in
    const s = defaultFamilySettings('double-tee');
    const res = await eng.agent.put('/api/settings/double-tee').set('X-CSRF-Token', eng.csrf).send({ ...s, tolerance: { ...s.tolerance, cap: 0.5, source: 'Project specification section 03 41 13', confidence: 'plant' } });
    expect(res.status).toBe(200);
    await runProjection(t.deps, piece.id);
    expect(Number((await projection(piece.id)).tolerance_mm)).toBeCloseTo(12.7, 6); // ±1/2 in
    const audit = await t.ds.query(`SELECT action FROM audit_event WHERE entity = 'family_setting' AND plant_id = $1`, [plant.plantId]);
    expect(audit).toEqual([{ action: 'update-settings' }]);
  });
  it('when the reading ages are out of order, then 400 names the field', async () => {
    const s = defaultFamilySettings('hollow-core');
    const res = await eng.agent.put('/api/settings/hollow-core').set('X-CSRF-Token', eng.csrf).send({ ...s, readingAges: [7, 28, 14] });
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.readingAges[0]).toMatch(/increasing order/);
  });
  it('when an inspector tries to change settings, then 403', async () => {
    const ins = await signIn(t.app, plant.users.inspector.email, PASSWORD);
    const res = await ins.agent.put('/api/settings/double-tee').set('X-CSRF-Token', ins.csrf).send(defaultFamilySettings('double-tee'));
    expect(res.status).toBe(403);
  });
});

describe('/api/calibration', () => {
  it('shows measured ÷ predicted by family and age; an adopted factor becomes the prior of new predictions', async () => {
    const p = await buildPiece(t.ds, plant.plantId);
    await buildReading(t.ds, plant.plantId, p.id, plant.users.inspector.id, { valueMm: 30, takenAt: new Date(Date.parse('2026-10-03T13:00:00Z')).toISOString() });
    await buildReading(t.ds, plant.plantId, p.id, plant.users.inspector.id, { valueMm: 45, takenAt: new Date(Date.parse('2026-10-20T13:00:00Z')).toISOString() });
    await runProjection(t.deps, p.id);
    const view = await eng.agent.get('/api/calibration');
    const dt = view.body.find((f: { productType: string }) => f.productType === 'double-tee');
    expect(dt.readings).toBeGreaterThan(0);
    expect(dt.byAge.map((b: { label: string }) => b.label)).toEqual(['at release (≤ 3 d)', '3–28 d', '28–90 d', 'over 90 d']);
    const fresh = await buildPiece(t.ds, plant.plantId, { castDate: new Date().toISOString().slice(0, 10) });
    const adopt = await eng.agent.post('/api/calibration/adopt').set('X-CSRF-Token', eng.csrf).send({ productType: 'double-tee', growthFactor: 1.3, growthFactorSd: 0.1 });
    expect(adopt.status).toBe(204);
    await runProjection(t.deps, fresh.id);
    const pr = await projection(fresh.id);
    expect(pr.readings_used).toBe(0);
    expect(Number(pr.growth_factor)).toBeCloseTo(1.3, 6);
    const after = await eng.agent.get('/api/calibration');
    expect(after.body.find((f: { productType: string }) => f.productType === 'double-tee').adopted).toMatchObject({ growthFactor: 1.3, by: 'Test engineer' });
  });
});
