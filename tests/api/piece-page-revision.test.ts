import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pieceDetailSchema, type PieceDetail } from '#shared/api/piece-detail';
import { keptPages } from '#server/db/kept-pages';
import { signIn, type Session, type TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildJob, buildPiece, buildPlantWithUsers, buildReading, buildUser, PASSWORD } from '../helpers/factories';

// The server keeps built piece pages and sends one again while the piece's revision is unchanged
// (migration PiecePageRevision). Every change the page shows must reach the next view.
let t: TestApp;
let plant: PlantWithUsers;
let qc: Session;
let inspector: Session;
beforeAll(async () => {
  ({ t, plant, session: qc } = await appWithPlant('qc_manager'));
  inspector = await signIn(t.app, plant.users.inspector.email, PASSWORD);
});
afterAll(() => t.close());

const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=', 'base64');

async function view(s: Session, pieceId: string): Promise<PieceDetail> {
  const res = await s.agent.get(`/api/pieces/${pieceId}`);
  expect(res.status).toBe(200);
  return pieceDetailSchema.parse(res.body);
}

/** The page as built afresh, with nothing kept. */
async function built(s: Session, pieceId: string): Promise<PieceDetail> {
  keptPages(t.ds, 'piece').clear();
  return view(s, pieceId);
}

/** Views the page (so it is kept), makes the change, and returns the next view, checked against a fresh build. */
async function afterChange(pieceId: string, change: () => Promise<unknown>): Promise<PieceDetail> {
  await view(qc, pieceId);
  expect(keptPages(t.ds, 'piece').has(pieceId)).toBe(true);
  await change();
  const next = await view(qc, pieceId);
  expect(next).toEqual(await built(qc, pieceId));
  return next;
}

const postReading = (pieceId: string, key: string, over: Record<string, unknown> = {}) =>
  inspector.agent.post('/api/readings').set('X-CSRF-Token', inspector.csrf).set('Idempotency-Key', key)
    .send({ pieceId, value: '1 3/8', unit: 'in', takenAt: '2026-11-20T07:30:00-06:00', method: 'level', support: 'dunnage', ...over });

describe('GET /api/pieces/:id after a change', () => {
  it('when a reading is logged, corrected, photographed, fixed or removed, then the next view shows each step', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    let logged = '';
    const a = await afterChange(piece.id, async () => (logged = (await postReading(piece.id, `rev-a-${piece.id}`)).body.id));
    expect(a.readings.map((r) => r.id)).toEqual([logged]);
    expect(a.piece.latestReading?.valueMm).toBeCloseTo(34.925, 6);

    let fix = '';
    const b = await afterChange(piece.id, async () => (fix = (await postReading(piece.id, `rev-b-${piece.id}`, { value: '1 1/4', supersedes: logged, correctionReason: 'wrong mark on the tape' })).body.id));
    expect(b.readings.find((r) => r.id === logged)?.supersededBy).toBe(fix);
    expect(b.piece.latestReading?.valueMm).toBeCloseTo(31.75, 6);

    const c = await afterChange(piece.id, () => inspector.agent.post(`/api/readings/${fix}/photo`).set('X-CSRF-Token', inspector.csrf).attach('photo', PNG, 'tape.png'));
    expect(c.readings.find((r) => r.id === fix)?.hasPhoto).toBe(true);
    // Readings are appended, but a data fix in the database must reach the page as well.
    const d = await afterChange(piece.id, () => t.ds.query(`UPDATE reading SET note = 'tape checked' WHERE id = $1`, [fix]));
    expect(d.readings.find((r) => r.id === fix)?.note).toBe('tape checked');
    const e = await afterChange(piece.id, () => t.ds.query(`DELETE FROM reading_photo WHERE reading_id = $1`, [fix]));
    expect(e.readings.find((r) => r.id === fix)?.hasPhoto).toBe(false);
    await t.ds.query(`UPDATE reading SET superseded_by = NULL WHERE id = $1`, [logged]);
    const f = await afterChange(piece.id, () => t.ds.query(`DELETE FROM reading WHERE id = $1`, [fix]));
    expect(f.readings.map((r) => r.id)).toEqual([logged]);
  });

  it('when a decision is recorded or the piece row changes, then the next view shows it', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    const before = await view(qc, piece.id);
    const held = await afterChange(piece.id, () => qc.agent.post(`/api/pieces/${piece.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'hold', comment: 'measure at dawn', version: before.piece.version }));
    expect([held.piece.status, held.decisions.map((x) => x.comment)]).toEqual(['hold', ['measure at dawn']]);
    // A decision written alone (as a data fix would), without the piece's status changing with it.
    const noted = await afterChange(piece.id, () => t.ds.query(`INSERT INTO decision (plant_id, piece_id, kind, comment, decided_by) VALUES ($1, $2, 'remeasure', 'second tape', $3)`, [plant.plantId, piece.id, plant.users.qc_manager.id]));
    expect(noted.decisions.map((x) => x.comment)).toEqual(['second tape', 'measure at dawn']);
    const moved = await afterChange(piece.id, () => t.ds.query(`UPDATE piece SET bed = 'Bed 9' WHERE id = $1`, [piece.id]));
    expect(moved.piece.bed).toBe('Bed 9');
  });

  it("when an inspector's name, the plant's time zone, a job number or a design changes, then pages that show them change", async () => {
    const other = await buildPlantWithUsers(t.ds);
    const otherQc = await signIn(t.app, other.users.qc_manager.email, PASSWORD);
    const piece = await buildPiece(t.ds, plant.plantId);
    // 19:00 UTC in sun: 13:00 in Chicago (likely distorted), 08:00 in Auckland (not).
    await buildReading(t.ds, plant.plantId, piece.id, plant.users.inspector.id, { takenAt: '2026-11-20T19:00:00Z', sky: 'sun-on-top' });
    await view(otherQc, other.piece.id);

    const renamed = await afterChange(piece.id, () => t.ds.query(`UPDATE app_user SET name = 'R. Okafor' WHERE id = $1`, [plant.users.inspector.id]));
    expect(renamed.readings.map((r) => r.takenBy)).toEqual(['R. Okafor']);
    const zoned = await afterChange(piece.id, () => t.ds.query(`UPDATE plant SET time_zone = 'Pacific/Auckland' WHERE id = $1`, [plant.plantId]));
    expect(zoned.readings.map((r) => r.likelyDistorted)).toEqual([false]);
    const renumbered = await afterChange(piece.id, () => t.ds.query(`UPDATE job SET number = 'J-REV-9' WHERE id = $1`, [piece.jobId]));
    expect(renumbered.piece.jobNumber).toBe('J-REV-9');
    const designId = renumbered.design.id;
    const redesigned = await afterChange(piece.id, () => t.ds.query(`UPDATE member_design SET name = 'Double tee, renamed' WHERE id = $1`, [designId]));
    expect(redesigned.design.name).toBe('Double tee, renamed');
    // Another plant's pages were not touched by any of it.
    const [{ rev }] = await t.ds.query(`SELECT coalesce((SELECT rev FROM piece_page WHERE piece_id = $1), 0) AS rev`, [other.piece.id]);
    const [{ page_gen }] = await t.ds.query(`SELECT page_gen FROM plant WHERE id = $1`, [other.plantId]);
    expect([Number(rev), Number(page_gen)]).toEqual([1, 0]);
  });
});

describe('GET /api/pieces/:id from a kept page', () => {
  it('when nothing the page shows has changed, then the kept page is sent without building it again', async () => {
    const piece = await buildPiece(t.ds, plant.plantId);
    await buildReading(t.ds, plant.plantId, piece.id, plant.users.inspector.id, { valueMm: 30 });
    const first = await view(qc, piece.id);
    // A change made with the revision triggers off is invisible to the kept page: proof that it is used.
    await t.ds.transaction(async (tx) => {
      await tx.query(`SET LOCAL session_replication_role = replica`);
      await tx.query(`UPDATE reading SET value_mm = 99 WHERE piece_id = $1`, [piece.id]);
    });
    expect(await view(qc, piece.id)).toEqual(first);
    expect((await built(qc, piece.id)).readings[0]?.valueMm).toBe(99);
  });

  it('when a kept page is asked for by someone who may not see the piece, then 404 as before', async () => {
    const jobB = await buildJob(t.ds, plant.plantId);
    const piece = await buildPiece(t.ds, plant.plantId, { jobId: jobB.id });
    await view(qc, piece.id);
    expect(keptPages(t.ds, 'piece').has(piece.id)).toBe(true);
    const viewer = await signIn(t.app, plant.users.viewer.email, PASSWORD); // a viewer of another job
    expect((await viewer.agent.get(`/api/pieces/${piece.id}`)).status).toBe(404);
    const stranger = await buildPlantWithUsers(t.ds);
    const outsider = await signIn(t.app, stranger.users.qc_manager.email, PASSWORD);
    const res = await outsider.agent.get(`/api/pieces/${piece.id}`);
    expect([res.status, res.body.code]).toEqual([404, 'not_found']);
    const sameJobViewer = await buildUser(t.ds, plant.plantId, 'viewer', { jobId: jobB.id });
    expect((await view(await signIn(t.app, sameJobViewer.email, PASSWORD), piece.id)).piece.id).toBe(piece.id);
  });
});
