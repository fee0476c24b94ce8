import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { reviewPageSchema, type ReviewPage } from '#shared/api/review';
import { keptPages } from '#server/db/kept-pages';
import { signIn, type Session, type TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildDesign, buildJob, buildPiece, buildPlantWithUsers, PASSWORD } from '../helpers/factories';

// The server keeps built review-list pages and sends one again while the plant's review revision is
// unchanged (migration ReviewPageRevision). Every change the list shows must reach the next request.
let t: TestApp;
let plant: PlantWithUsers;
let qc: Session;
beforeAll(async () => {
  ({ t, plant, session: qc } = await appWithPlant('qc_manager'));
  // A flagged piece throughout, so the list has a page to keep (a page past the end is not kept).
  await t.ds.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, 'reading-overdue', 1, 'due')`, [plant.plantId, plant.piece.id]);
});
afterAll(() => t.close());

const QUERY = 'view=all-flagged&sort=mark&pageSize=100';

async function list(s: Session = qc): Promise<ReviewPage> {
  const res = await s.agent.get(`/api/review?${QUERY}`);
  expect(res.status).toBe(200);
  return reviewPageSchema.parse(res.body);
}

/** The list as built afresh, with nothing kept. */
async function built(): Promise<ReviewPage> {
  keptPages(t.ds, 'review').clear();
  return list();
}

/** Lists (so the page is kept), makes the change, and returns the next list, checked against a fresh build. */
async function afterChange(change: () => Promise<unknown>): Promise<ReviewPage> {
  await list();
  expect(keptPages(t.ds, 'review').size).toBeGreaterThan(0);
  await change();
  const next = await list();
  expect(next).toEqual(await built());
  return next;
}

const rowOf = (page: ReviewPage, pieceId: string) => page.items.find((i) => i.pieceId === pieceId);
const revisionOf = async (plantId: string): Promise<number> =>
  Number((await t.ds.query(`SELECT coalesce(sum(rev), 0) AS rev FROM review_count WHERE plant_id = $1`, [plantId]))[0].rev);

describe('GET /api/review after a change', () => {
  it('when flags, decisions, the piece, its projection, its job and its design change, then the next list shows each change', async () => {
    const other = await buildPlantWithUsers(t.ds);
    const otherRevision = await revisionOf(other.plantId);
    const job = await buildJob(t.ds, plant.plantId);
    const design = await buildDesign(t.ds, plant.plantId);
    const piece = await buildPiece(t.ds, plant.plantId, { jobId: job.id, designId: design.id, mark: 'RV-1' });

    const raised = await afterChange(() => t.ds.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, 'outside-band', 2, 'above the band')`, [plant.plantId, piece.id]));
    expect(rowOf(raised, piece.id)?.flags.map((f) => [f.kind, f.severity])).toEqual([['outside-band', 2]]);

    const worse = await afterChange(() => t.ds.query(`UPDATE piece_flag SET severity = 3, reason = 'far above the band' WHERE piece_id = $1`, [piece.id]));
    expect(rowOf(worse, piece.id)?.flags[0]).toMatchObject({ severity: 3, reason: 'far above the band' });

    const version = (await qc.agent.get(`/api/pieces/${piece.id}`)).body.piece.version;
    const decided = await afterChange(() =>
      qc.agent.post(`/api/pieces/${piece.id}/decisions`).set('X-CSRF-Token', qc.csrf).send({ kind: 'hold', comment: 'waiting for the engineer of record', version }).expect(201),
    );
    expect(rowOf(decided, piece.id)?.lastDecision?.kind).toBe('hold');

    const moved = await afterChange(() => t.ds.query(`UPDATE piece SET ship_date = '2027-01-15', bay = 'Bay 7' WHERE id = $1`, [piece.id]));
    expect([rowOf(moved, piece.id)?.shipDate, rowOf(moved, piece.id)?.bay]).toEqual(['2027-01-15', 'Bay 7']);

    const projected = await afterChange(() =>
      t.ds.query(
        `INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                                 latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, tolerance_mm, differential_mm, curve)
         VALUES ($1, $2, now(), 'test', 'test', 1, 1, 0.1, 1, 41.5, 40, 35, 45, 19, 6, '[]')`,
        [piece.id, plant.plantId],
      ),
    );
    expect(rowOf(projected, piece.id)?.latest).toEqual({ mm: 41.5, expectedMm: 40, lowMm: 35, highMm: 45 });

    const renumbered = await afterChange(() => t.ds.query(`UPDATE job SET number = number || '-B' WHERE id = $1`, [job.id]));
    expect(rowOf(renumbered, piece.id)?.jobNumber).toBe(`${job.number}-B`);

    const retyped = await afterChange(() => t.ds.query(`UPDATE member_design SET product_type = 'hollow-core' WHERE id = $1`, [design.id]));
    expect(rowOf(retyped, piece.id)?.productType).toBe('hollow-core');

    const cleared = await afterChange(() => t.ds.query(`UPDATE piece_flag SET cleared_at = now() WHERE piece_id = $1`, [piece.id]));
    expect(rowOf(cleared, piece.id)).toBeUndefined();
    // Another plant's revision was not touched by any of it.
    expect(await revisionOf(other.plantId)).toBe(otherRevision);
  });
});

describe('GET /api/review from a kept page', () => {
  it('when nothing the list shows has changed, then the kept page is sent without building it again, and only to its plant', async () => {
    const piece = await buildPiece(t.ds, plant.plantId, { mark: 'RV-KEPT' });
    await t.ds.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, 'outside-tolerance', 3, 'over the limit')`, [plant.plantId, piece.id]);
    const first = await list();
    // A change made with the triggers off leaves the revision alone: the kept page hides it, which shows it is used.
    await t.ds.transaction(async (tx) => {
      await tx.query(`SET LOCAL session_replication_role = replica`);
      await tx.query(`UPDATE review_item SET doc = jsonb_set(doc::jsonb, '{mark}', '"RV-BUILT"')::text WHERE piece_id = $1`, [piece.id]);
    });
    expect(await list()).toEqual(first);
    expect(rowOf(await built(), piece.id)?.mark).toBe('RV-BUILT');
    // A QC manager of another plant asking the same query gets that plant's list, even at the same revision.
    const stranger = await buildPlantWithUsers(t.ds);
    await t.ds.query(`INSERT INTO review_count (plant_id, flagged, needs_decision, rev) VALUES ($1, 0, 0, $2)`, [stranger.plantId, (await revisionOf(plant.plantId)) - (await revisionOf(stranger.plantId))]);
    expect(await revisionOf(stranger.plantId)).toBe(await revisionOf(plant.plantId));
    const theirs = await list(await signIn(t.app, stranger.users.qc_manager.email, PASSWORD));
    expect(theirs.items.some((i) => i.pieceId === piece.id)).toBe(false);
  });
});
