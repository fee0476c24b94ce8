import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Flag } from '#shared/projection/project';
import { syncFlags } from '#server/projections/flag-sync';
import { buildPiece, buildPlant } from '../helpers/factories';
import { testApp, type TestApp } from '../helpers/app';

// syncFlags compares the pieces' active flags with the wanted ones and writes only the differences.
let t: TestApp;
let plantId: string;
beforeAll(async () => {
  t = await testApp();
  plantId = (await buildPlant(t.ds)).id;
});
afterAll(() => t.close());

const KINDS = ['outside-band', 'outside-tolerance', 'reading-overdue', 'neighbour-mismatch'] as const;
const band = (reason: string, severity = 2): Flag => ({ kind: 'outside-band', severity, reason });
const overdue: Flag = { kind: 'reading-overdue', severity: 1, reason: 'The reading due on 2026-11-20 has not been taken.' };
/** Every flag row of a piece, with its row version (xmin changes whenever the row is written). */
const rowsOf = (pieceId: string): Promise<Array<{ id: string; kind: string; severity: number; reason: string; raised_at: Date; cleared_at: Date | null; xmin: string }>> =>
  t.ds.query(`SELECT id, kind, severity, reason, raised_at, cleared_at, xmin::text FROM piece_flag WHERE piece_id = $1 ORDER BY raised_at, kind`, [pieceId]);

describe('syncFlags', () => {
  it('when the wanted flags equal the active ones, then nothing is written', async () => {
    const p = await buildPiece(t.ds, plantId);
    expect(await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [band('above the band'), overdue] }], KINDS)).toHaveLength(2);
    const before = await rowsOf(p.id);
    const [{ n: summariesBefore }] = await t.ds.query(`SELECT count(*)::int AS n FROM review_item WHERE piece_id = $1`, [p.id]);
    expect(await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [overdue, band('above the band')] }], KINDS)).toEqual([]);
    expect(await rowsOf(p.id)).toEqual(before);
    expect(summariesBefore).toBe(1);
  });

  it('when a reason or severity changes, then the same flag is updated and keeps its raised time; when it is no longer wanted, then it is cleared', async () => {
    const p = await buildPiece(t.ds, plantId);
    await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [band('above the band by 1/8 in')] }], KINDS);
    const [first] = await rowsOf(p.id);
    for (const [reason, severity] of [['above the band by 1/4 in', 2], ['above the band by 1/4 in', 3]] as const) {
      expect(await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [band(reason, severity)] }], KINDS)).toEqual([]);
      const [changed] = await rowsOf(p.id);
      expect([changed!.id, changed!.raised_at, changed!.reason, changed!.severity, changed!.cleared_at]).toEqual([first!.id, first!.raised_at, reason, severity, null]);
    }
    await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [] }], KINDS);
    const [cleared] = await rowsOf(p.id);
    expect(cleared!.id).toBe(first!.id);
    expect(cleared!.cleared_at).not.toBeNull();
    // Raised again later: a new flag, the cleared one kept as history.
    const again = await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [band('above the band by 1/8 in')] }], KINDS);
    expect(again).toEqual([{ pieceId: p.id, plantId }]);
    expect((await rowsOf(p.id)).map((r) => r.cleared_at === null)).toEqual([false, true]);
  });

  it('when kinds are not decided for a piece, then its flags of those kinds are left alone', async () => {
    const p = await buildPiece(t.ds, plantId);
    await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [{ kind: 'neighbour-mismatch', severity: 2, reason: 'B-2 is 3/4 in above B-1' }, overdue] }], KINDS);
    await syncFlags(t.ds, [{ plantId, pieceId: p.id, flags: [], kinds: ['reading-overdue'] }], KINDS);
    const rows = await rowsOf(p.id);
    expect(rows.filter((r) => r.cleared_at === null).map((r) => r.kind)).toEqual(['neighbour-mismatch']);
  });

  it('when two runs raise the same flag at once, then it is stored once and reported raised once', async () => {
    const p = await buildPiece(t.ds, plantId);
    const want = [{ plantId, pieceId: p.id, flags: [band('above the band')] }];
    // The first run's insert is not committed yet when the second reads the piece's flags: the second
    // inserts too, waits for the first to commit, and then finds the flag there.
    let second: Promise<unknown[]> = Promise.resolve([]);
    const first = await t.ds.transaction(async (tx) => {
      const raised = await syncFlags(tx, want, KINDS);
      second = syncFlags(t.ds, want, KINDS);
      await new Promise((r) => setTimeout(r, 300));
      return raised;
    });
    expect([first.length, (await second).length]).toEqual([1, 0]);
    expect(await rowsOf(p.id)).toHaveLength(1);
  });
});
