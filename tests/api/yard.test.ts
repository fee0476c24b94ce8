import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dateInZone } from '#shared/yard/schedule';
import type { Session, TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildPiece } from '../helpers/factories';

let t: TestApp;
let plant: PlantWithUsers;
let inspector: Session;
beforeAll(async () => ({ t, plant, session: inspector } = await appWithPlant('inspector')));
afterAll(() => t.close());

const daysAgo = (n: number): string => dateInZone(new Date(Date.now() - n * 86_400_000), 'America/Chicago');

describe('GET /api/yard/pack', () => {
  it('when pieces are in the yard, then they come with their designs and whether a reading is due', async () => {
    const fresh = await buildPiece(t.ds, plant.plantId, { castDate: daysAgo(3), mark: 'YD-1' });
    const answered = await buildPiece(t.ds, plant.plantId, { castDate: daysAgo(3), mark: 'YD-2' });
    await t.ds.query(
      `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, taken_by, idempotency_key, request_hash)
       VALUES ($1, $2, now(), 30, '1 3/16', 'in', 'level', 'dunnage', $3, $4, 'x')`,
      [plant.plantId, answered.id, plant.users.inspector.id, `k-${answered.id}`],
    );
    const shipped = await buildPiece(t.ds, plant.plantId, { castDate: daysAgo(3), mark: 'YD-3', status: 'shipped' });
    const res = await inspector.agent.get('/api/yard/pack');
    expect(res.status).toBe(200);
    const byMark = new Map(res.body.pieces.map((p: { mark: string }) => [p.mark, p]));
    expect(byMark.get('YD-1')).toMatchObject({ id: fresh.id, due: true, overdue: false });
    expect(byMark.get('YD-2')).toMatchObject({ due: false });
    expect(byMark.has('YD-3')).toBe(false);
    expect(shipped.id).toBeTruthy();
    const designIds = new Set(res.body.designs.map((d: { id: string }) => d.id));
    for (const p of res.body.pieces) expect(designIds.has(p.designId)).toBe(true);
  });
});
