import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPiece, buildPlant, buildUser } from '../helpers/factories';
import { testApp, type TestApp } from '../helpers/app';

// `review_item` is a stored summary kept by triggers (migrations ReviewItem, ReviewCount, ReviewItemDoc, ReviewItemShown).
// Whatever the writers do, it must equal the summary computed from scratch from flags, decisions, pieces,
// projections, jobs and designs.
let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(() => t.close());

const FROM_SCRATCH = `
  SELECT p.id AS piece_id, p.mark, p.bay, p.status, p.ship_date::text AS ship_date, max(f.severity)::int AS max_severity,
         max(f.raised_at) FILTER (WHERE f.severity >= 2) AS last_serious_at, array_agg(f.kind ORDER BY f.kind) AS flag_kinds,
         (SELECT kind FROM decision x WHERE x.piece_id = p.id ORDER BY decided_at DESC LIMIT 1) AS decision_kind
    FROM piece p JOIN piece_flag f ON f.piece_id = p.id AND f.cleared_at IS NULL
   WHERE p.plant_id = $1 GROUP BY p.id ORDER BY p.id`;
const STORED = `
  SELECT piece_id, mark, bay, status, ship_date::text AS ship_date, max_severity, last_serious_at, flag_kinds, decision_kind
    FROM review_item WHERE plant_id = $1 ORDER BY piece_id`;

const KINDS = ['outside-band', 'outside-tolerance', 'reading-overdue'] as const;
type Op =
  | { op: 'raise'; piece: number; kind: (typeof KINDS)[number]; severity: number }
  | { op: 'clear'; piece: number; kind: (typeof KINDS)[number] }
  | { op: 'decide'; piece: number; kind: 'accept' | 'hold' }
  | { op: 'edit'; piece: number; bay: string | null; ship: number }
  | { op: 'ship'; piece: number }
  | { op: 'delete-flags'; piece: number }
  | { op: 'compact' }
  | { op: 'project'; piece: number; mm: number | null }
  | { op: 'project-and-raise'; piece: number; mm: number; kind: (typeof KINDS)[number]; flagFirst: boolean }
  | { op: 'rename-job'; piece: number }
  | { op: 'retype-design'; piece: number };

const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ op: fc.constant('raise' as const), piece: fc.nat(2), kind: fc.constantFrom(...KINDS), severity: fc.integer({ min: 1, max: 3 }) }),
  fc.record({ op: fc.constant('clear' as const), piece: fc.nat(2), kind: fc.constantFrom(...KINDS) }),
  fc.record({ op: fc.constant('decide' as const), piece: fc.nat(2), kind: fc.constantFrom('accept' as const, 'hold' as const) }),
  fc.record({ op: fc.constant('edit' as const), piece: fc.nat(2), bay: fc.option(fc.constantFrom('Bay 1', 'Bay 2')), ship: fc.integer({ min: 0, max: 30 }) }),
  fc.record({ op: fc.constant('ship' as const), piece: fc.nat(2) }),
  fc.record({ op: fc.constant('delete-flags' as const), piece: fc.nat(2) }),
  fc.constant({ op: 'compact' as const }),
  fc.record({ op: fc.constant('project' as const), piece: fc.nat(2), mm: fc.option(fc.integer({ min: -20, max: 120 })) }),
  fc.record({ op: fc.constant('project-and-raise' as const), piece: fc.nat(2), mm: fc.integer({ min: -20, max: 120 }), kind: fc.constantFrom(...KINDS), flagFirst: fc.boolean() }),
  fc.record({ op: fc.constant('rename-job' as const), piece: fc.nat(2) }),
  fc.record({ op: fc.constant('retype-design' as const), piece: fc.nat(2) }),
);

const PROJECT = `INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                                         latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, ship_mm, ship_low_mm, ship_high_mm, tolerance_mm, differential_mm, curve)
                 VALUES ($1, $2, now(), 'test', 'test', 1, 1, 0.1, 1, $3::numeric, $3::numeric - 1.5, $3::numeric - 6.25, $3::numeric + 6.25, $3::numeric + 4, $3::numeric - 2, $3::numeric + 10, 19, 6, '[]')
                 ON CONFLICT (piece_id) DO UPDATE SET latest_mm = EXCLUDED.latest_mm, latest_expected_mm = EXCLUDED.latest_expected_mm, latest_low_mm = EXCLUDED.latest_low_mm,
                   latest_high_mm = EXCLUDED.latest_high_mm, ship_mm = EXCLUDED.ship_mm, ship_low_mm = EXCLUDED.ship_low_mm, ship_high_mm = EXCLUDED.ship_high_mm, computed_at = now()`;

/** Each stored row's JSON (migration ReviewItemDoc) against the review row built here from the tables. */
async function expectDocsFromScratch(plantId: string): Promise<void> {
  const stored: Array<{ piece_id: string; doc: string }> = await t.ds.query(`SELECT piece_id, doc FROM review_item WHERE plant_id = $1 ORDER BY piece_id`, [plantId]);
  const expected = [];
  for (const { piece_id: id } of stored) {
    const [p] = await t.ds.query(
      `SELECT p.mark, j.number, d.product_type, p.bay, p.status, p.ship_date::text AS ship_date, pr.latest_mm, pr.latest_expected_mm, pr.latest_low_mm,
              pr.latest_high_mm, pr.ship_mm, pr.ship_low_mm, pr.ship_high_mm
         FROM piece p JOIN job j ON j.id = p.job_id JOIN member_design d ON d.id = p.design_id LEFT JOIN projection pr ON pr.piece_id = p.id WHERE p.id = $1`,
      [id],
    );
    const flags = await t.ds.query(`SELECT kind, severity, reason, raised_at FROM piece_flag WHERE piece_id = $1 AND cleared_at IS NULL ORDER BY severity DESC, raised_at`, [id]);
    const [x] = await t.ds.query(`SELECT kind, decided_at FROM decision WHERE piece_id = $1 ORDER BY decided_at DESC LIMIT 1`, [id]);
    const num = (v: string | null): number | null => (v == null ? null : Number(v));
    expected.push({
      pieceId: id, mark: p.mark, jobNumber: p.number, productType: p.product_type, bay: p.bay, status: p.status, shipDate: p.ship_date,
      flags: flags.map((f: { kind: string; severity: number; reason: string; raised_at: Date }) => ({ kind: f.kind, severity: f.severity, reason: f.reason, raisedAt: f.raised_at.toISOString() })),
      latest: p.latest_mm == null ? null : { mm: num(p.latest_mm), expectedMm: num(p.latest_expected_mm), lowMm: num(p.latest_low_mm), highMm: num(p.latest_high_mm) },
      atShip: p.ship_mm == null ? null : { mm: num(p.ship_mm), lowMm: num(p.ship_low_mm), highMm: num(p.ship_high_mm) },
      lastDecision: x ? { kind: x.kind, at: x.decided_at.toISOString() } : null,
    });
  }
  expect(stored.map((r) => JSON.parse(r.doc))).toEqual(expected);
}

/** The plant's stored rows, as one fingerprint, and its review revision. */
async function rowsAndRevision(plantId: string): Promise<{ rows: string; rev: number }> {
  const [r] = await t.ds.query(
    `SELECT (SELECT coalesce(md5(string_agg(x::text, '|' ORDER BY x.piece_id)), '') FROM review_item x WHERE x.plant_id = $1) AS rows,
            (SELECT coalesce(sum(rev), 0) FROM review_count WHERE plant_id = $1) AS rev`,
    [plantId],
  );
  return { rows: r.rows, rev: Number(r.rev) };
}

// The kept totals of the unfiltered views (migration ReviewCount) against a count of the summary rows.
const KEPT_TOTALS = `SELECT coalesce(sum(flagged), 0)::int AS flagged, coalesce(sum(needs_decision), 0)::int AS needs_decision FROM review_count WHERE plant_id = $1`;
const COUNTED_TOTALS = `SELECT count(*)::int AS flagged, (count(*) FILTER (WHERE needs_decision))::int AS needs_decision FROM review_item WHERE plant_id = $1 AND status <> 'shipped'`;

describe('the stored review summary', () => {
  it('when flags, decisions and pieces change in any order, then the summary equals the one computed from scratch', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(opArb, { minLength: 1, maxLength: 25 }), async (ops) => {
        const plant = await buildPlant(t.ds);
        const qc = await buildUser(t.ds, plant.id, 'qc_manager');
        const pieces = [];
        for (let i = 0; i < 4; i++) pieces.push((await buildPiece(t.ds, plant.id)).id);
        let clock = Date.UTC(2026, 10, 1);
        const at = (): string => new Date((clock += 60_000)).toISOString();
        for (const o of ops) {
          const before = await rowsAndRevision(plant.id);
          const id = 'piece' in o ? pieces[o.piece] : undefined;
          if (o.op === 'raise') {
            await t.ds.query(
              `INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason, raised_at) VALUES ($1, $2, $3, $4, 'test', $5)
               ON CONFLICT (piece_id, kind) WHERE cleared_at IS NULL DO UPDATE SET severity = EXCLUDED.severity`,
              [plant.id, id, o.kind, o.severity, at()],
            );
          } else if (o.op === 'clear') {
            await t.ds.query(`UPDATE piece_flag SET cleared_at = $3 WHERE piece_id = $1 AND kind = $2 AND cleared_at IS NULL`, [id, o.kind, at()]);
          } else if (o.op === 'decide') {
            await t.ds.query(`INSERT INTO decision (plant_id, piece_id, kind, decided_by, decided_at) VALUES ($1, $2, $3, $4, $5)`, [plant.id, id, o.kind, qc.id, at()]);
          } else if (o.op === 'edit') {
            await t.ds.query(`UPDATE piece SET bay = $2, ship_date = date '2026-12-01' + $3::int WHERE id = $1`, [id, o.bay, o.ship]);
          } else if (o.op === 'ship') {
            await t.ds.query(`UPDATE piece SET status = 'shipped' WHERE id = $1`, [id]);
          } else if (o.op === 'project') {
            // Figures shown in the row, or none (a projection without a reading yet).
            await t.ds.query(PROJECT, [id, plant.id, o.mm]);
          } else if (o.op === 'project-and-raise') {
            // One statement storing a projection and raising a flag, as a projection batch does; either
            // part may be the statement's last, so the triggers of either table may fire first.
            const raise = `INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason, raised_at) VALUES ($2, $1, $4, 2, 'batch', $5)
                           ON CONFLICT (piece_id, kind) WHERE cleared_at IS NULL DO UPDATE SET reason = 'batch again'`;
            const [first, last] = o.flagFirst ? [raise, PROJECT] : [PROJECT, raise];
            await t.ds.query(`WITH w0 AS (${first} RETURNING 1) ${last}`, [id, plant.id, o.mm, o.kind, at()]);
          } else if (o.op === 'rename-job') {
            await t.ds.query(`UPDATE job SET number = number || '-R' WHERE id = (SELECT job_id FROM piece WHERE id = $1)`, [id]);
          } else if (o.op === 'retype-design') {
            await t.ds.query(`UPDATE member_design SET product_type = CASE product_type WHEN 'double-tee' THEN 'hollow-core' ELSE 'double-tee' END WHERE id = (SELECT design_id FROM piece WHERE id = $1)`, [id]);
          } else if (o.op === 'delete-flags') {
            await t.ds.query(`DELETE FROM piece_flag WHERE piece_id = $1`, [id]);
          } else {
            await t.ds.query('SELECT review_count_compact()');
          }
          // After every step: a later write to the same piece would hide a missed refresh.
          await expectDocsFromScratch(plant.id);
          // The plant's review revision (migration ReviewPageRevision) never goes back, and moves whenever a row changed.
          const after = await rowsAndRevision(plant.id);
          expect(after.rev).toBeGreaterThanOrEqual(before.rev);
          if (after.rows !== before.rows) expect(after.rev, `${o.op} changed the rows`).toBeGreaterThan(before.rev);
        }
        expect(await t.ds.query(STORED, [plant.id])).toEqual(await t.ds.query(FROM_SCRATCH, [plant.id]));
        expect(await t.ds.query(KEPT_TOTALS, [plant.id])).toEqual(await t.ds.query(COUNTED_TOTALS, [plant.id]));
      }),
      { numRuns: 60 },
    );
  });

  it('when a flagged piece is projected again, then its stored row shows the new figures', async () => {
    const plant = await buildPlant(t.ds);
    const piece = await buildPiece(t.ds, plant.id);
    await t.ds.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, 'outside-band', 2, 'test')`, [plant.id, piece.id]);
    const project = (mm: number): Promise<unknown> =>
      t.ds.query(
        `INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                                 latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, tolerance_mm, differential_mm, curve)
         VALUES ($1, $2, now(), 'test', 'test', 1, 1, 0.1, 1, $3::numeric, $3, $3 - 5, $3 + 5, 19, 6, '[]')
         ON CONFLICT (piece_id) DO UPDATE SET latest_mm = EXCLUDED.latest_mm, latest_expected_mm = EXCLUDED.latest_expected_mm`,
        [piece.id, plant.id, mm],
      );
    const shown = async (): Promise<unknown> => JSON.parse((await t.ds.query(`SELECT doc FROM review_item WHERE piece_id = $1`, [piece.id]))[0].doc).latest;
    await project(30);
    expect(await shown()).toEqual({ mm: 30, expectedMm: 30, lowMm: 25, highMm: 35 });
    await project(42.5);
    expect(await shown()).toEqual({ mm: 42.5, expectedMm: 42.5, lowMm: 25, highMm: 35 });
  });

  it('when a flag is raised and a decision is saved on the same piece at the same moment, then the summary holds both', async () => {
    const plant = await buildPlant(t.ds);
    const qc = await buildUser(t.ds, plant.id, 'qc_manager');
    const piece = await buildPiece(t.ds, plant.id);
    await t.ds.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, 'outside-band', 2, 'first')`, [plant.id, piece.id]);
    // Two transactions held open together: the flag writer commits only after the decision writer has
    // started its own refresh, which must wait and then see the new flag.
    const a = t.ds.createQueryRunner();
    const b = t.ds.createQueryRunner();
    await a.connect();
    await b.connect();
    try {
      await a.startTransaction();
      await a.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, 'outside-tolerance', 3, 'second')`, [plant.id, piece.id]);
      await b.startTransaction();
      const decided = b.query(`INSERT INTO decision (plant_id, piece_id, kind, decided_by) VALUES ($1, $2, 'hold', $3)`, [plant.id, piece.id, qc.id]).then(() => b.commitTransaction());
      await new Promise((r) => setTimeout(r, 200));
      await a.commitTransaction();
      await decided;
    } finally {
      await a.release();
      await b.release();
    }
    const [row] = await t.ds.query(`SELECT max_severity, flag_kinds, decision_kind FROM review_item WHERE piece_id = $1`, [piece.id]);
    expect(row).toEqual({ max_severity: 3, flag_kinds: ['outside-band', 'outside-tolerance'], decision_kind: 'hold' });
  });
});
