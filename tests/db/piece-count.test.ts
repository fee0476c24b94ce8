import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { piecePageSchema } from '#shared/api/pieces';
import { signIn, testApp, type TestApp } from '../helpers/app';
import { buildDesign, buildJob, buildPiece, buildPlant, buildUser, PASSWORD } from '../helpers/factories';

// `piece_count` keeps how many pieces each (plant, job, design, status) has, as delta rows written by
// triggers (migration PieceCount). Whatever the writers do, the sums must equal a count of the pieces.
let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(() => t.close());

const STATUSES = ['in_storage', 'hold', 'shipped'] as const;
type Op =
  | { op: 'add'; job: number; design: number; n: number }
  | { op: 'status'; piece: number; status: (typeof STATUSES)[number] }
  | { op: 'move'; piece: number; job: number }
  | { op: 'redesign'; piece: number; design: number }
  | { op: 'bay'; piece: number }
  | { op: 'remove'; piece: number }
  | { op: 'compact' };

const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ op: fc.constant('add' as const), job: fc.nat(1), design: fc.nat(1), n: fc.integer({ min: 1, max: 3 }) }),
  fc.record({ op: fc.constant('status' as const), piece: fc.nat(9), status: fc.constantFrom(...STATUSES) }),
  fc.record({ op: fc.constant('move' as const), piece: fc.nat(9), job: fc.nat(1) }),
  fc.record({ op: fc.constant('redesign' as const), piece: fc.nat(9), design: fc.nat(1) }),
  fc.record({ op: fc.constant('bay' as const), piece: fc.nat(9) }),
  fc.record({ op: fc.constant('remove' as const), piece: fc.nat(9) }),
  fc.constant({ op: 'compact' as const }),
);

const COUNTED = `SELECT job_id, design_id, status, count(*)::int AS n FROM piece WHERE plant_id = $1 GROUP BY 1, 2, 3 ORDER BY 1, 2, 3`;
const KEPT = `SELECT job_id, design_id, status, sum(n)::int AS n FROM piece_count WHERE plant_id = $1 GROUP BY 1, 2, 3 HAVING sum(n) <> 0 ORDER BY 1, 2, 3`;

describe('piece_count', () => {
  it('when pieces are added, moved, re-designed, given another status or removed in any order, then the kept counts equal a count', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(opArb, { minLength: 1, maxLength: 14 }), async (ops) => {
        const plant = await buildPlant(t.ds);
        const jobs = [(await buildJob(t.ds, plant.id)).id, (await buildJob(t.ds, plant.id)).id];
        const designs = [(await buildDesign(t.ds, plant.id)).id, (await buildDesign(t.ds, plant.id, 'HC8-30')).id];
        const pieces: string[] = [(await buildPiece(t.ds, plant.id, { jobId: jobs[0], designId: designs[0] })).id];
        const pick = (i: number): string | undefined => pieces[i % pieces.length];
        for (const o of ops) {
          if (o.op === 'add') {
            // Several pieces in one statement, as an import writes them.
            const rows: Array<{ id: string }> = await t.ds.query(
              `INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date, status)
               SELECT $1, $2, $3, 'PC-' || gen_random_uuid(), date '2026-10-01', date '2026-10-02', 'in_storage' FROM generate_series(1, $4) RETURNING id`,
              [plant.id, jobs[o.job], designs[o.design], o.n],
            );
            pieces.push(...rows.map((r) => r.id));
          } else if (o.op === 'compact') await t.ds.query('SELECT piece_count_compact()');
          else if (pieces.length) {
            const id = pick(o.piece)!;
            if (o.op === 'status') await t.ds.query(`UPDATE piece SET status = $2 WHERE id = $1`, [id, o.status]);
            if (o.op === 'move') await t.ds.query(`UPDATE piece SET job_id = $2 WHERE id = $1`, [id, jobs[o.job]]);
            if (o.op === 'redesign') await t.ds.query(`UPDATE piece SET design_id = $2 WHERE id = $1`, [id, designs[o.design]]);
            if (o.op === 'bay') await t.ds.query(`UPDATE piece SET bay = 'Bay 3' WHERE plant_id = $1`, [plant.id]);
            if (o.op === 'remove') {
              await t.ds.query(`DELETE FROM piece WHERE id = $1`, [id]);
              pieces.splice(pieces.indexOf(id), 1);
            }
          }
        }
        expect(await t.ds.query(KEPT, [plant.id])).toEqual(await t.ds.query(COUNTED, [plant.id]));
      }),
      { numRuns: 25 },
    );
  });

  it('when the list is filtered without a search, then its total is the kept sum and equals the pieces it pages through', async () => {
    const plant = await buildPlant(t.ds);
    const jobA = (await buildJob(t.ds, plant.id)).id;
    const jobB = (await buildJob(t.ds, plant.id)).id;
    const dt = (await buildDesign(t.ds, plant.id, 'DT28-60')).id;
    const hc = (await buildDesign(t.ds, plant.id, 'HC8-30')).id;
    for (let i = 0; i < 7; i++) await buildPiece(t.ds, plant.id, { jobId: i % 2 ? jobA : jobB, designId: i % 3 ? dt : hc, status: i % 4 ? 'in_storage' : 'hold' });
    const engineer = await buildUser(t.ds, plant.id, 'engineer');
    const viewer = await buildUser(t.ds, plant.id, 'viewer', { jobId: jobA });
    const s = await signIn(t.app, engineer.email, PASSWORD);
    const v = await signIn(t.app, viewer.email, PASSWORD);
    const total = async (agent: typeof s.agent, query: string): Promise<[number, number]> => {
      const page = piecePageSchema.parse((await agent.get(`/api/pieces?pageSize=100&${query}`)).body);
      return [page.total, page.items.length];
    };
    expect(await total(s.agent, '')).toEqual([7, 7]);
    expect(await total(s.agent, `jobId=${jobA}`)).toEqual([3, 3]);
    expect(await total(s.agent, 'status=hold')).toEqual([2, 2]);
    expect(await total(s.agent, 'productType=hollow-core')).toEqual([3, 3]);
    expect(await total(s.agent, `productType=double-tee&status=in_storage&jobId=${jobB}`)).toEqual([1, 1]);
    expect(await total(v.agent, '')).toEqual([3, 3]);
    // The kept counts are what was summed: a count row written by hand shows in the total of a page without a search, not with one.
    await t.ds.query(`INSERT INTO piece_count (plant_id, job_id, design_id, status, n) VALUES ($1, $2, $3, 'hold', 5)`, [plant.id, jobA, dt]);
    expect(await total(s.agent, '')).toEqual([12, 7]);
    expect(await total(s.agent, 'q=DT')).toEqual([7, 7]);
    await t.ds.query(`INSERT INTO piece_count (plant_id, job_id, design_id, status, n) VALUES ($1, $2, $3, 'hold', -5)`, [plant.id, jobA, dt]);
  });
});
