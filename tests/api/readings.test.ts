import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Session, TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildPiece, buildPlantWithUsers } from '../helpers/factories';

let t: TestApp;
let plant: PlantWithUsers;
let inspector: Session;
beforeAll(async () => ({ t, plant, session: inspector } = await appWithPlant('inspector')));
afterAll(() => t.close());

const body = (pieceId: string, over: Record<string, unknown> = {}) => ({
  pieceId, value: '1 3/8', unit: 'in', takenAt: '2026-11-20T07:30:00-06:00', method: 'tape-string-line', support: 'dunnage', sky: 'overcast', ...over,
});
const post = (s: Session, key: string, b: object) => s.agent.post('/api/readings').set('X-CSRF-Token', s.csrf).set('Idempotency-Key', key).send(b);
const count = async (pieceId: string): Promise<number> => Number((await t.ds.query(`SELECT count(*) FROM reading WHERE piece_id = $1`, [pieceId]))[0].count);

describe('POST /api/readings', () => {
  it('when a reading is logged, then it is stored in mm with the text as typed, the server time beside it, and audited', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const res = await post(inspector, `k-${piece.id}`, body(piece.id));
    expect(res.status).toBe(201);
    expect(res.body.valueMm).toBeCloseTo(34.925, 6);
    expect(res.body.enteredText).toBe('1 3/8');
    expect(new Date(res.body.receivedAt).getTime()).toBeGreaterThan(Date.now() - 60_000);
    const audits = await t.ds.query(`SELECT action FROM audit_event WHERE entity = 'reading' AND entity_id = $1`, [res.body.id]);
    expect(audits).toEqual([{ action: 'create' }]);
  });
  it('when the same key comes again with the same body, then the stored reading is returned and nothing is added', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const first = await post(inspector, `same-${piece.id}`, body(piece.id));
    const again = await post(inspector, `same-${piece.id}`, body(piece.id));
    expect(again.status).toBe(200);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body.id).toBe(first.body.id);
    expect(await count(piece.id)).toBe(1);
  });
  it('when the same key comes with a different body, then 422 and nothing is added', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    await post(inspector, `diff-${piece.id}`, body(piece.id));
    const res = await post(inspector, `diff-${piece.id}`, body(piece.id, { value: '1 1/2' }));
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('idempotency_key_reused');
    expect(await count(piece.id)).toBe(1);
  });
  it('when ten copies of one reading race, then exactly one row exists', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const results = await Promise.all(Array.from({ length: 10 }, () => post(inspector, `race-${piece.id}`, body(piece.id))));
    expect(results.every((r) => r.status === 200 || r.status === 201)).toBe(true);
    expect(new Set(results.map((r) => r.body.id)).size).toBe(1);
    expect(await count(piece.id)).toBe(1);
  });
  it('when the value cannot be read, then 400 names the value field and says why', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const res = await post(inspector, `bad-${piece.id}`, body(piece.id, { value: '1 3/7' }));
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.value[0]).toMatch(/sixteenths/);
  });
  it('when the Idempotency-Key header is missing, then 400 names the header', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const res = await inspector.agent.post('/api/readings').set('X-CSRF-Token', inspector.csrf).send(body(piece.id));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fieldErrors)[0]).toMatch(/Idempotency-Key/);
  });
  it('when the piece belongs to another plant, then 404 and nothing is stored', async () => {
    const other = await buildPlantWithUsers(t.ds);
    const before = await count(other.piece.id);
    const res = await post(inspector, `cross-${other.piece.id}`, body(other.piece.id));
    expect(res.status).toBe(404);
    expect(await count(other.piece.id)).toBe(before);
  });
  it('when a reading is corrected, then a new reading supersedes the old one, which stays unchanged', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const first = await post(inspector, `c1-${piece.id}`, body(piece.id));
    const fix = await post(inspector, `c2-${piece.id}`, body(piece.id, { value: '1 1/4', supersedes: first.body.id, correctionReason: 'read the wrong mark on the tape' }));
    expect(fix.status).toBe(201);
    const detail = await inspector.agent.get(`/api/pieces/${piece.id}`);
    const old = detail.body.readings.find((r: { id: string }) => r.id === first.body.id);
    expect(old.supersededBy).toBe(fix.body.id);
    expect(old.valueMm).toBeCloseTo(34.925, 6);
    const again = await post(inspector, `c3-${piece.id}`, body(piece.id, { value: '1', supersedes: first.body.id, correctionReason: 'second try' }));
    expect(again.status).toBe(409);
  });
  it('when a correction gives no reason, then 400 asks for one', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const first = await post(inspector, `r1-${piece.id}`, body(piece.id));
    const res = await post(inspector, `r2-${piece.id}`, body(piece.id, { supersedes: first.body.id }));
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.correctionReason).toBeDefined();
  });
  it('when taken in afternoon sun, then the reading is marked likely distorted', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const res = await post(inspector, `sun-${piece.id}`, body(piece.id, { takenAt: '2026-11-20T15:00:00-06:00', sky: 'sun-on-top' }));
    expect(res.body.likelyDistorted).toBe(true);
  });
});
