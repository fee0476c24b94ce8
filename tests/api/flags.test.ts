import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memberCurve } from '#shared/camber/curve';
import { predictInputSchema } from '#shared/camber/schema';
import { reviewPageSchema } from '#shared/api/review';
import { dateInZone } from '#shared/yard/schedule';
import { checkAllBays, runProjection, runProjectionBatch } from '#server/projections/projection.service';
import { curvePoints } from '#server/projections/stored-result';
import { loadPiecesForProjection } from '#server/projections/projection.repository';
import { projectPiece } from '#shared/projection/project';
import { DEMO_DESIGNS } from '#seed/designs';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildDesign, buildJob, buildPiece, buildPlantWithUsers, buildReading, PASSWORD } from '../helpers/factories';

// Each flag raised and cleared by a reading history built from the design's own prediction.
let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let qc: Session;
let designId: string;
const spec = DEMO_DESIGNS.find((d) => d.code === 'DT28-60')!.spec;
const curve = memberCurve(predictInputSchema.parse({ ...spec, agesDays: [1] }));
const girderCurve = memberCurve(predictInputSchema.parse({ ...DEMO_DESIGNS.find((d) => d.code === 'BG54-110')!.spec, agesDays: [1] }));
const DAY = 86_400_000;
const tz = 'America/Chicago';
const isoDay = (d: Date): string => dateInZone(d, tz);

beforeAll(async () => {
  t = await testApp();
  plant = await buildPlantWithUsers(t.ds);
  designId = (await buildDesign(t.ds, plant.plantId, 'DT28-60')).id;
  qc = await signIn(t.app, plant.users.qc_manager.email, PASSWORD);
});
afterAll(() => t.close());

/** A piece cast `ageDays` ago with readings at given ages (07:00 local, overcast unless told). */
async function pieceWith(ageDays: number, readings: Array<{ age: number; inches: (c: ReturnType<typeof curve.at>) => number; sky?: string; hourUtc?: number }>, o: { shipInDays?: number; bay?: string; position?: number; jobId?: string; design?: string; curve?: typeof curve } = {}) {
  const cast = new Date(Date.now() - ageDays * DAY);
  const piece = await buildPiece(t.ds, plant.plantId, { designId: o.design ?? designId, castDate: isoDay(cast), jobId: o.jobId });
  const ship = isoDay(new Date(Date.now() + (o.shipInDays ?? 20) * DAY));
  await t.ds.query(`UPDATE piece SET ship_date = $2, erection_date = $2::date + 2, bay = $3, bay_position = $4 WHERE id = $1`, [piece.id, ship, o.bay ?? null, o.position ?? null]);
  for (const r of readings) {
    const takenAt = new Date(Date.parse(`${isoDay(cast)}T00:00:00Z`) + r.age * DAY);
    takenAt.setUTCHours(r.hourUtc ?? 13, 0, 0, 0);
    const inches = r.inches((o.curve ?? curve).at(Math.max(1, (takenAt.getTime() - Date.parse(`${isoDay(cast)}T00:00:00Z`)) / DAY)));
    await buildReading(t.ds, plant.plantId, piece.id, plant.users.inspector.id, { valueMm: inches * 25.4, takenAt: takenAt.toISOString(), sky: r.sky ?? 'overcast' });
  }
  return piece;
}

const flagsOf = async (pieceId: string): Promise<string[]> => {
  const res = await qc.agent.get(`/api/pieces/${pieceId}/projection`);
  expect(res.status).toBe(200);
  return res.body.flags.map((f: { kind: string }) => f.kind).sort();
};

const addReading = async (pieceId: string, inches: number, sky = 'overcast'): Promise<void> => {
  await buildReading(t.ds, plant.plantId, pieceId, plant.users.inspector.id, { valueMm: inches * 25.4, takenAt: new Date().toISOString(), sky });
};

describe('flags from the projection job', () => {
  it('when every reading follows the prediction, then no flag is raised', async () => {
    const p = await pieceWith(30, [{ age: 1, inches: (c) => c.camber }, { age: 7, inches: (c) => c.camber }, { age: 28, inches: (c) => c.camber }]);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).toEqual([]);
  });

  it('when the latest reading is outside the band but inside tolerance, then "outside the expected band"; an in-band reading clears it', async () => {
    const p = await pieceWith(30, [{ age: 7, inches: (c) => c.camber }, { age: 28, inches: (c) => (c.high + c.toleranceHigh) / 2 }]);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).toContain('outside-band');
    await addReading(p.id, curve.at(30).camber);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).not.toContain('outside-band');
    const [row] = await t.ds.query(`SELECT cleared_at FROM piece_flag WHERE piece_id = $1 AND kind = 'outside-band'`, [p.id]);
    expect(row.cleared_at).not.toBeNull();
  });

  it('when the latest reading is past the tolerance limit, then "outside tolerance" with the limit in the reason', async () => {
    const p = await pieceWith(30, [{ age: 28, inches: (c) => c.toleranceHigh + 0.25 }]);
    await runProjection(t.deps, p.id);
    const res = await qc.agent.get(`/api/pieces/${p.id}/projection`);
    const f = res.body.flags.find((x: { kind: string }) => x.kind === 'outside-tolerance');
    expect(f.reason).toMatch(/above the tolerance limit of/);
    expect(f.severity).toBe(3);
  });

  it('when a girder creeps twice as fast as predicted but is inside tolerance today, then "heading outside by ship date"', async () => {
    const fast = (c: ReturnType<typeof curve.at>): number => c.elastic + 2 * c.growth;
    const girder = await buildDesign(t.ds, plant.plantId, 'BG54-110');
    const p = await pieceWith(14, [1, 4, 7, 10, 14].map((age) => ({ age, inches: fast })), { shipInDays: 110, design: girder.id, curve: girderCurve });
    const now = girderCurve.at(14);
    expect(fast(now)).toBeLessThan(now.toleranceHigh); // inside tolerance today
    await runProjection(t.deps, p.id);
    const res = await qc.agent.get(`/api/pieces/${p.id}/projection`);
    expect(res.body.flags.map((f: { kind: string }) => f.kind)).toContain('heading-outside');
    expect(res.body.flags.find((f: { kind: string }) => f.kind === 'heading-outside').reason).toMatch(/at the ship date .* above the tolerance limit/);
  });

  it('when the scheduled reading has waited more than two days, then "reading overdue"; a reading clears it', async () => {
    const p = await pieceWith(20, [{ age: 1, inches: (c) => c.camber }]);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).toContain('reading-overdue');
    await addReading(p.id, curve.at(20).camber);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).not.toContain('reading-overdue');
  });

  it('when the latest reading was taken in afternoon sun, then "reading in doubt", and it does not raise a band flag', async () => {
    const p = await pieceWith(10, [{ age: 7, inches: (c) => c.camber }, { age: 9, inches: (c) => c.toleranceHigh + 0.5, sky: 'sun-on-top', hourUtc: 21 }]);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).toEqual(['reading-in-doubt']);
  });

  it('when camber jumps more than creep explains, then "reading in doubt"', async () => {
    const p = await pieceWith(10, [{ age: 7, inches: (c) => c.camber }, { age: 9, inches: (c) => c.camber + 0.7 }]);
    await runProjection(t.deps, p.id);
    expect(await flagsOf(p.id)).toContain('reading-in-doubt');
  });

  it('when neighbours in a bay are projected too far apart, then the odd one out is flagged "mismatch with neighbours"', async () => {
    const job = (await buildJob(t.ds, plant.plantId)).id;
    const normal = (c: ReturnType<typeof curve.at>): number => c.camber;
    const a = await pieceWith(14, [{ age: 7, inches: normal }, { age: 14, inches: normal }], { bay: 'Bay 9', position: 1, jobId: job });
    const b = await pieceWith(14, [{ age: 7, inches: (c) => c.camber + 0.7 }, { age: 14, inches: (c) => c.camber + 0.9 }], { bay: 'Bay 9', position: 2, jobId: job });
    const c = await pieceWith(14, [{ age: 7, inches: normal }, { age: 14, inches: normal }], { bay: 'Bay 9', position: 3, jobId: job });
    for (const p of [a, b, c]) await runProjection(t.deps, p.id);
    expect(await flagsOf(b.id)).toContain('neighbour-mismatch');
    expect(await flagsOf(a.id)).not.toContain('neighbour-mismatch');
    expect(await flagsOf(c.id)).not.toContain('neighbour-mismatch');

    // Moved out of the bay: its own run clears the flag, though its projection is unchanged.
    await t.ds.query(`UPDATE piece SET bay = NULL, bay_position = NULL WHERE id = $1`, [b.id]);
    await runProjection(t.deps, b.id);
    expect(await flagsOf(b.id)).not.toContain('neighbour-mismatch');
    // Put back without any projection run (as an import might): the nightly sweep of every bay finds it.
    await t.ds.query(`UPDATE piece SET bay = 'Bay 9', bay_position = 2 WHERE id = $1`, [b.id]);
    await runProjectionBatch(t.deps, [a.id, b.id, c.id], new Date(), { bays: 'none' });
    expect(await flagsOf(b.id)).not.toContain('neighbour-mismatch'); // a nightly batch checks no bay
    await checkAllBays(t.deps, plant.plantId);
    expect(await flagsOf(b.id)).toContain('neighbour-mismatch');
  });

  it('when the same projection runs twice, then the stored result and flags are the same', async () => {
    const p = await pieceWith(30, [{ age: 28, inches: (c) => c.toleranceHigh + 0.25 }]);
    const now = new Date();
    await runProjection(t.deps, p.id, now);
    const first = await t.ds.query(`SELECT inputs_hash, result_hash, ship_mm, growth_factor, curve FROM projection WHERE piece_id = $1`, [p.id]);
    await runProjection(t.deps, p.id, now);
    const second = await t.ds.query(`SELECT inputs_hash, result_hash, ship_mm, growth_factor, curve FROM projection WHERE piece_id = $1`, [p.id]);
    expect(second).toEqual(first);
    expect(await t.ds.query(`SELECT count(*)::int AS n FROM piece_flag WHERE piece_id = $1`, [p.id])).toEqual([{ n: 1 }]);
  });

  it('when a result is unchanged, then it is marked as computed again; when a reading changes it, then it is rewritten', async () => {
    const p = await pieceWith(30, [{ age: 14, inches: (c) => c.camber }, { age: 28, inches: (c) => c.camber }]);
    const row = async (): Promise<{ computed_at: Date; result_hash: string; latest_mm: string }> =>
      (await t.ds.query(`SELECT computed_at, result_hash, latest_mm FROM projection WHERE piece_id = $1`, [p.id]))[0];
    await runProjection(t.deps, p.id, new Date('2026-11-20T03:00:00Z'));
    const first = await row();
    await runProjection(t.deps, p.id, new Date('2026-11-20T04:00:00Z'));
    const again = await row();
    expect(again.result_hash).toBe(first.result_hash);
    expect(again.computed_at.toISOString()).toBe('2026-11-20T04:00:00.000Z');
    await addReading(p.id, curve.at(30).camber + 0.5);
    await runProjection(t.deps, p.id, new Date('2026-11-20T05:00:00Z'));
    const changed = await row();
    expect(changed.result_hash).not.toBe(first.result_hash);
    expect(changed.latest_mm).not.toBe(first.latest_mm);
  });
});

describe('the stored curve', () => {
  it('when a projection is stored, then the piece page gets the engine\'s curve, every value to 0.01', async () => {
    const p = await pieceWith(30, [{ age: 7, inches: (c) => c.camber }, { age: 28, inches: (c) => c.camber * 1.05 }], { shipInDays: 20 });
    const at = new Date();
    await runProjection(t.deps, p.id, at);
    const [loaded] = await loadPiecesForProjection(t.ds, [p.id], at);
    const engine = projectPiece(loaded!.input()).curve;
    const res = await qc.agent.get(`/api/pieces/${p.id}/projection`);
    expect(res.status).toBe(200);
    const shown: Array<Record<string, number>> = res.body.projection.curve;
    expect(shown).toHaveLength(engine.length);
    expect(engine.length).toBeGreaterThan(10);
    const to01 = (v: number): number => Math.round(v * 100) / 100;
    expect(shown).toEqual(engine.map((pt) => Object.fromEntries(Object.entries(pt).map(([k, v]) => [k, to01(v)]))));
  });
});

describe('night after night', () => {
  const night = (n: number): Date => new Date(Date.now() + n * DAY);

  it('when a piece stays in the yard past its ship date, then its stored curve reaches 30 days past today and changes once a week, not every night', async () => {
    const p = await pieceWith(40, [{ age: 7, inches: (c) => c.camber }, { age: 28, inches: (c) => c.camber }], { shipInDays: -5 });
    const [{ cast_date: cast }] = await t.ds.query(`SELECT cast_date::text FROM piece WHERE id = $1`, [p.id]);
    const seen: string[] = [];
    for (let n = 0; n < 8; n++) {
      await runProjection(t.deps, p.id, night(n));
      const [pr] = await t.ds.query(`SELECT result_hash, curve FROM projection WHERE piece_id = $1`, [p.id]);
      const todayAge = (Date.parse(`${isoDay(night(n))}T12:00:00Z`) - Date.parse(`${cast}T00:00:00Z`)) / DAY; // ages of dates are at noon
      const last = curvePoints(pr.curve).at(-1)!;
      expect(last.ageDays).toBeGreaterThanOrEqual(todayAge + 30);
      expect(last.ageDays).toBeLessThan(todayAge + 30 + 7);
      seen.push(pr.result_hash);
    }
    const changes = seen.slice(1).filter((h, i) => h !== seen[i]).length;
    expect(changes).toBe(1); // seven nights, one weekly point passed
  });

  it('when a reading stays overdue, then its flag is not rewritten the next night', async () => {
    const p = await pieceWith(20, [{ age: 1, inches: (c) => c.camber }]);
    await runProjection(t.deps, p.id, night(0));
    const flag = async (): Promise<{ id: string; reason: string; xmin: string }> =>
      (await t.ds.query(`SELECT id, reason, xmin::text FROM piece_flag WHERE piece_id = $1 AND kind = 'reading-overdue' AND cleared_at IS NULL`, [p.id]))[0];
    const first = await flag();
    expect(first.reason).toMatch(/^The reading due on \d{4}-\d\d-\d\d has not been taken\.$/);
    await runProjection(t.deps, p.id, night(1));
    expect(await flag()).toEqual(first);
  });

  it('when a nightly batch changes every projection, even at erection, then it checks no bay; the check of every bay after the night flags the odd one out', async () => {
    const job = (await buildJob(t.ds, plant.plantId)).id;
    const normal = (c: ReturnType<typeof curve.at>): number => c.camber;
    const o = { jobId: job, bay: 'Bay 4', shipInDays: -5 };
    const a = await pieceWith(40, [{ age: 7, inches: normal }, { age: 14, inches: normal }], { ...o, position: 1 });
    const b = await pieceWith(40, [{ age: 7, inches: (c) => c.camber + 0.7 }, { age: 14, inches: (c) => c.camber + 0.9 }], { ...o, position: 2 });
    const c = await pieceWith(40, [{ age: 7, inches: normal }, { age: 14, inches: normal }], { ...o, position: 3 });
    await t.ds.query(`UPDATE piece SET bay = NULL, bay_position = NULL WHERE id = $1`, [b.id]);
    await runProjectionBatch(t.deps, [a.id, b.id, c.id], night(0));
    // Back in the bay without a run of its own, and erected a week later: a week on, every result has changed.
    await t.ds.query(`UPDATE piece SET bay = 'Bay 4', bay_position = 2, erection_date = erection_date + 7 WHERE id = $1`, [b.id]);
    const stored = async (): Promise<string[]> =>
      (await t.ds.query(`SELECT result_hash || erection_mm AS s FROM projection WHERE piece_id = ANY($1::uuid[]) ORDER BY piece_id`, [[a.id, b.id, c.id]])).map((r: { s: string }) => r.s);
    const before = await stored();
    await runProjectionBatch(t.deps, [a.id, b.id, c.id], night(7), { bays: 'none' });
    expect((await stored()).filter((h, i) => h !== before[i])).toHaveLength(3);
    expect(await flagsOf(b.id)).not.toContain('neighbour-mismatch');
    await checkAllBays(t.deps, plant.plantId);
    expect(await flagsOf(b.id)).toContain('neighbour-mismatch');
    expect(await flagsOf(a.id)).not.toContain('neighbour-mismatch');
  });
});

describe('GET /api/review and decisions', () => {
  it('when a flagged piece gets a hold with a comment, then it leaves the "needs a decision" view but stays among all flagged', async () => {
    const p = await pieceWith(30, [{ age: 28, inches: (c) => c.toleranceHigh + 0.3 }], { shipInDays: 3 });
    await runProjection(t.deps, p.id);
    const before = reviewPageSchema.parse((await qc.agent.get('/api/review')).body);
    const row = before.items.find((i) => i.pieceId === p.id)!;
    expect(row.flags[0]!.kind).toBe('outside-tolerance');
    expect(row.daysToShip).toBe(3);
    // Times as toISOString() writes them, whatever the database session's zone; values from the stored projection.
    const [flag] = await t.ds.query(`SELECT raised_at, severity, reason FROM piece_flag WHERE piece_id = $1 AND kind = 'outside-tolerance' AND cleared_at IS NULL`, [p.id]);
    expect(row.flags[0]).toEqual({ kind: 'outside-tolerance', severity: flag.severity, reason: flag.reason, raisedAt: new Date(flag.raised_at).toISOString() });
    const [pr] = await t.ds.query(`SELECT latest_mm, ship_mm, ship_low_mm, ship_high_mm FROM projection WHERE piece_id = $1`, [p.id]);
    expect([row.latest?.mm, row.atShip]).toEqual([Number(pr.latest_mm), { mm: Number(pr.ship_mm), lowMm: Number(pr.ship_low_mm), highMm: Number(pr.ship_high_mm) }]);
    expect([row.status, row.lastDecision, before.page, before.pageSize]).toEqual(['in_storage', null, 1, 25]);
    const detail = await qc.agent.get(`/api/pieces/${p.id}`);
    const noComment = await qc.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'hold', comment: '', version: detail.body.piece.version });
    expect(noComment.status).toBe(400);
    const hold = await qc.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'hold', comment: 'measure at dawn', version: detail.body.piece.version });
    expect(hold.status).toBe(201);
    expect(hold.body.status).toBe('hold');
    const after = await qc.agent.get('/api/review');
    expect(after.body.items.some((i: { pieceId: string }) => i.pieceId === p.id)).toBe(false);
    const all = reviewPageSchema.parse((await qc.agent.get('/api/review?view=all-flagged')).body);
    const [decided] = await t.ds.query(`SELECT decided_at FROM decision WHERE piece_id = $1`, [p.id]);
    expect(all.items.find((i) => i.pieceId === p.id)!.lastDecision).toEqual({ kind: 'hold', at: new Date(decided.decided_at).toISOString() });
  });
  it('when two people decide on the same version at once, then one succeeds and the other gets 409 with the current state', async () => {
    const p = await pieceWith(30, [{ age: 28, inches: (c) => c.camber }]);
    const other = await signIn(t.app, plant.users.engineer.email, PASSWORD);
    const v = (await qc.agent.get(`/api/pieces/${p.id}`)).body.piece.version;
    const [a, b] = await Promise.all([
      qc.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'hold', comment: 'wait for QC', version: v }),
      other.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', other.csrf).send({ kind: 'accept', comment: '', version: v }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.current.version).toBe(v + 1);
    expect(Number((await t.ds.query(`SELECT count(*) FROM decision WHERE piece_id = $1`, [p.id]))[0].count)).toBe(1);
  });
  it('when a flagged piece is cleared to ship without a comment, then 400; with one, then cleared and audited', async () => {
    const p = await pieceWith(30, [{ age: 28, inches: (c) => c.toleranceHigh + 0.3 }]);
    await runProjection(t.deps, p.id);
    let v = (await qc.agent.get(`/api/pieces/${p.id}`)).body.piece.version;
    const bare = await qc.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'clear', version: v });
    expect(bare.status).toBe(400);
    expect(bare.body.fieldErrors.comment).toBeDefined();
    const ok = await qc.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'clear', comment: 'EOR accepted by e-mail of today', version: v });
    expect(ok.status).toBe(201);
    v = ok.body.version;
    const audit = await t.ds.query(`SELECT action FROM audit_event WHERE entity = 'piece' AND entity_id = $1`, [p.id]);
    expect(audit).toEqual([{ action: 'decide-clear' }]);
  });
  it('when an engineer tries to clear a piece to ship, then 403', async () => {
    const p = await pieceWith(30, [{ age: 28, inches: (c) => c.camber }]);
    const eng = await signIn(t.app, plant.users.engineer.email, PASSWORD);
    const v = (await eng.agent.get(`/api/pieces/${p.id}`)).body.piece.version;
    const res = await eng.agent.post(`/api/pieces/${p.id}/decisions`).set('X-CSRF-Token', eng.csrf).send({ kind: 'clear', comment: 'fine', version: v });
    expect(res.status).toBe(403);
  });
});
