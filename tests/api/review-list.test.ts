import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { reviewPageSchema } from '#shared/api/review';
import { dateInZone } from '#shared/yard/schedule';
import { signIn, testApp, type Session, type TestApp } from '../helpers/app';
import { buildPiece, buildPlantWithUsers, PASSWORD } from '../helpers/factories';

// The review list's pages: order, totals and days to ship, read from the stored rows (review_item).
let t: TestApp;
let qc: Session;
let plantId: string;
const DAY = 86_400_000;
const today = (): string => dateInZone(new Date(), 'America/Chicago');
const inDays = (n: number): string => dateInZone(new Date(Date.now() + n * DAY), 'America/Chicago');

// Marks, ship dates (days from today, or none) and the flags raised on each piece.
const PIECES: Array<{ mark: string; ship: number | null; flags: Array<[string, number]> }> = [
  { mark: 'RL-1', ship: 10, flags: [['outside-band', 2]] },
  { mark: 'RL-2', ship: 3, flags: [['outside-tolerance', 3], ['reading-overdue', 1]] },
  { mark: 'RL-3', ship: 3, flags: [['outside-band', 2]] },
  { mark: 'RL-4', ship: null, flags: [['outside-tolerance', 3]] },
  { mark: 'RL-5', ship: -2, flags: [['reading-overdue', 1]] },
];

beforeAll(async () => {
  t = await testApp();
  const plant = await buildPlantWithUsers(t.ds);
  plantId = plant.plantId;
  qc = await signIn(t.app, plant.users.qc_manager.email, PASSWORD);
  for (const p of PIECES) {
    const piece = await buildPiece(t.ds, plantId, { mark: p.mark });
    await t.ds.query(`UPDATE piece SET ship_date = $2 WHERE id = $1`, [piece.id, p.ship === null ? null : inDays(p.ship)]);
    for (const [kind, severity] of p.flags) await t.ds.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, $3, $4, 'test')`, [plantId, piece.id, kind, severity]);
  }
});
afterAll(() => t.close());

const page = async (query: string) => {
  const res = await qc.agent.get(`/api/review?${query}`);
  expect(res.status).toBe(200);
  return reviewPageSchema.parse(res.body);
};

describe('GET /api/review pages', () => {
  it('when all flagged pieces are paged by urgency, then ship date first, worst flag next, mark last, with the total on every page', async () => {
    const pages = [await page('view=all-flagged&pageSize=2&page=1'), await page('view=all-flagged&pageSize=2&page=2'), await page('view=all-flagged&pageSize=2&page=3')];
    expect(pages.map((p) => p.items.map((i) => i.mark))).toEqual([['RL-5', 'RL-2'], ['RL-3', 'RL-1'], ['RL-4']]);
    expect(pages.map((p) => [p.total, p.page, p.pageSize])).toEqual([[5, 1, 2], [5, 2, 2], [5, 3, 2]]);
  });
  it('when a page lies past the end, then it has no items and still the total', async () => {
    const p = await page('view=all-flagged&pageSize=2&page=9');
    expect([p.items, p.total, p.page]).toEqual([[], 5, 9]);
    const filtered = await page('view=all-flagged&flag=outside-band&page=4&pageSize=1');
    expect([filtered.items, filtered.total]).toEqual([[], 2]);
  });
  it('when rows are listed, then days to ship count from today on the plant clock, and none without a ship date', async () => {
    const p = await page('view=all-flagged&sort=mark&pageSize=25');
    expect(p.items.map((i) => [i.mark, i.daysToShip, i.shipDate])).toEqual([
      ['RL-1', 10, inDays(10)], ['RL-2', 3, inDays(3)], ['RL-3', 3, inDays(3)], ['RL-4', null, null], ['RL-5', -2, inDays(-2)],
    ]);
    expect(today()).toBe(inDays(0));
  });
  it('when filtered by a flag or narrowed to what needs a decision, then the total counts that view', async () => {
    const tol = await page('view=all-flagged&flag=outside-tolerance&sort=mark');
    expect([tol.items.map((i) => i.mark), tol.total]).toEqual([['RL-2', 'RL-4'], 2]);
    const needs = await page('view=needs-decision&sort=shipDate');
    // Severity 2 or more and no decision yet: all but the piece with only an overdue reading.
    expect([needs.items.map((i) => i.mark), needs.total]).toEqual([['RL-2', 'RL-3', 'RL-1', 'RL-4'], 4]);
  });
});
