import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBatchPool, type BatchPool } from '#server/projections/batch-pool';
import { runProjectionBatch } from '#server/projections/projection.service';
import { testApp, type TestApp } from '../helpers/app';
import { buildPiece, buildPlantWithUsers, buildReading } from '../helpers/factories';

// Nightly batches projected in threads of their own store what the server's thread stores.
let t: TestApp;
let pool: BatchPool;
beforeAll(async () => {
  t = await testApp();
  pool = createBatchPool(t.cfg, 2);
});
afterAll(async () => {
  await pool.close();
  await t.close();
});

const stored = (ids: string[]): Promise<unknown[]> =>
  t.ds.query(
    `SELECT p.piece_id, p.computed_at, p.result_hash, p.inputs_hash, p.curve, p.ship_mm,
            (SELECT array_agg(f.kind || ':' || f.reason ORDER BY f.kind) FROM piece_flag f WHERE f.piece_id = p.piece_id AND f.cleared_at IS NULL) AS flags
       FROM projection p WHERE p.piece_id = ANY($1::uuid[]) ORDER BY p.piece_id`,
    [ids],
  );

describe('projection threads', () => {
  it('when a batch runs in a thread, then it stores the same projections and flags as in the server thread, as of the night asked', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const pieces = [plant.piece, await buildPiece(t.ds, plant.plantId), await buildPiece(t.ds, plant.plantId)];
    await buildReading(t.ds, plant.plantId, pieces[1]!.id, plant.users.inspector.id, { valueMm: 80 }); // far above any prediction
    const ids = pieces.map((p) => p.id);
    const night = new Date('2026-12-10T02:30:00.000Z');

    const inThread = await pool.run(ids, night, 'none');
    const fromThread = await stored(ids);
    expect(inThread.projected).toBe(3);
    expect(fromThread.map((r) => (r as { computed_at: Date }).computed_at.toISOString())).toEqual(Array(3).fill(night.toISOString()));
    expect(inThread.raised.length).toBeGreaterThan(0);

    await t.ds.query(`DELETE FROM piece_flag WHERE piece_id = ANY($1::uuid[])`, [ids]);
    await t.ds.query(`DELETE FROM projection WHERE piece_id = ANY($1::uuid[])`, [ids]);
    const here = await runProjectionBatch(t.deps, ids, night, { bays: 'none' });
    expect(await stored(ids)).toEqual(fromThread);
    expect(here.raised.length).toBe(inThread.raised.length);
  });

  it('when the engine refuses a piece in a thread, then that piece comes back as failed with its message and the others are stored', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const good = await buildPiece(t.ds, plant.plantId);
    const bad = await buildPiece(t.ds, plant.plantId);
    await t.ds.query(`UPDATE member_design SET spec = spec || '{"length": -1}' WHERE id = (SELECT design_id FROM piece WHERE id = $1)`, [bad.id]);
    const r = await pool.run([good.id, bad.id], new Date(), 'none');
    expect(r.projected).toBe(1);
    expect(r.failed.map((f) => f.pieceId)).toEqual([bad.id]);
    expect(r.failed[0]!.error).toBeInstanceOf(Error);
    const [failure] = await t.ds.query(`SELECT message FROM projection_failure WHERE piece_id = $1`, [bad.id]);
    expect(failure.message).toBe((r.failed[0]!.error as Error).message);
  });
});
