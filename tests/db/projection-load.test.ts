import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadPiecesForProjection } from '#server/projections/projection.repository';
import { buildPiece, buildPlant, buildReading, buildUser } from '../helpers/factories';
import { testApp, type TestApp } from '../helpers/app';

// What the nightly load gives the engine of a piece's readings: read from the covering index of live
// readings (migration ReadingLiveIndex), in one query with the pieces.
let t: TestApp;
let plantId: string;
let inspector: string;
beforeAll(async () => {
  t = await testApp();
  plantId = (await buildPlant(t.ds)).id; // America/Chicago
  inspector = (await buildUser(t.ds, plantId, 'inspector')).id;
});
afterAll(() => t.close());

describe('loadPiecesForProjection', () => {
  it('when a piece has readings logged out of order and one corrected, then the engine gets the live ones, oldest first, with the hour on the plant clock', async () => {
    const piece = await buildPiece(t.ds, plantId, { castDate: '2026-07-01' });
    const late = await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: '2026-07-20T19:30:00Z', valueMm: 41.5, sky: 'sun-on-top' });
    const early = await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: '2026-07-03T12:05:00Z', valueMm: 30.25 });
    const wrong = await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: '2026-07-10T13:00:00Z', valueMm: 90 });
    const fixed = await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: '2026-07-10T13:00:00Z', valueMm: 35 });
    await t.ds.query(`UPDATE reading SET superseded_by = $2 WHERE id = $1`, [wrong.id, fixed.id]);

    const [loaded] = await loadPiecesForProjection(t.ds, [piece.id], new Date('2026-08-01T12:00:00Z'));
    expect(loaded!.input().readings).toEqual([
      // July is daylight time in Chicago: UTC − 5 h.
      { id: early.id, takenAt: '2026-07-03T12:05:00.000Z', valueMm: 30.25, support: 'dunnage', sky: null, localHour: 7 },
      { id: fixed.id, takenAt: '2026-07-10T13:00:00.000Z', valueMm: 35, support: 'dunnage', sky: null, localHour: 8 },
      { id: late.id, takenAt: '2026-07-20T19:30:00.000Z', valueMm: 41.5, support: 'dunnage', sky: 'sun-on-top', localHour: 14 },
    ]);
  });
  it('when a piece has no readings yet, then it is loaded with none, and a correction changes its inputs hash', async () => {
    const piece = await buildPiece(t.ds, plantId);
    const now = new Date('2026-11-01T12:00:00Z');
    const [bare] = await loadPiecesForProjection(t.ds, [piece.id], now);
    expect(bare!.input().readings).toEqual([]);
    const first = await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: '2026-10-05T14:00:00Z', valueMm: 30 });
    const [one] = await loadPiecesForProjection(t.ds, [piece.id], now);
    const fix = await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: '2026-10-05T14:00:00Z', valueMm: 31 });
    await t.ds.query(`UPDATE reading SET superseded_by = $2 WHERE id = $1`, [first.id, fix.id]);
    const [corrected] = await loadPiecesForProjection(t.ds, [piece.id], now);
    expect(corrected!.input().readings.map((r) => r.valueMm)).toEqual([31]);
    expect(new Set([bare!.inputsHash, one!.inputsHash, corrected!.inputsHash]).size).toBe(3);
  });
  it('when the load reads a piece\'s live readings, then the covering index alone can answer (an index-only scan)', async () => {
    const piece = await buildPiece(t.ds, plantId);
    for (let i = 0; i < 5; i++) await buildReading(t.ds, plantId, piece.id, inspector, { takenAt: `2026-10-0${i + 2}T14:00:00Z` });
    await t.ds.query('VACUUM (ANALYZE) reading');
    // A test database is small enough to be read whole; the planner is asked which index it would use.
    // (Whether the table's pages are then skipped depends on vacuum having run since other tests wrote.)
    const text = await t.ds.transaction(async (tx) => {
      await tx.query('SET LOCAL enable_seqscan = off');
      await tx.query('SET LOCAL enable_bitmapscan = off');
      const plan: Array<{ 'QUERY PLAN': string }> = await tx.query(
        `EXPLAIN (ANALYZE, COSTS OFF) SELECT json_agg(json_build_array(r.id, r.taken_at, r.value_mm, r.support, r.sky) ORDER BY r.taken_at)
           FROM reading r WHERE r.piece_id = $1 AND r.superseded_by IS NULL`,
        [piece.id],
      );
      return plan.map((r) => r['QUERY PLAN']).join('\n');
    });
    expect(text).toContain('Index Only Scan using reading_piece_live_idx');
  });
});
