import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { neighbourSteps, proposeBay, type BayCandidate } from '#shared/bays/match';

const RES = 25.4 / 32;

/** Brute force: every choice of n pieces containing the committed ones, in camber order. */
function brute(pool: BayCandidate[], n: number, z = 1): { worst: number; age: number } | null {
  const sorted = [...pool].sort((a, b) => a.camberMm - b.camberMm || a.id.localeCompare(b.id));
  let best: { worst: number; age: number } | null = null;
  const pick = (start: number, chosen: BayCandidate[]): void => {
    if (chosen.length === n) {
      if (!sorted.filter((x) => x.committed).every((x) => chosen.includes(x))) return;
      const worst = Math.max(0, ...chosen.slice(1).map((x, i) => neighbourSteps(chosen[i]!, x, z, RES)));
      const age = chosen.reduce((a, x) => a + x.ageDays, 0);
      if (!best || worst < best.worst || (worst === best.worst && age > best.age)) best = { worst, age };
      return;
    }
    for (let i = start; i < sorted.length; i++) pick(i + 1, [...chosen, sorted[i]!]);
  };
  pick(0, []);
  return best;
}

const piece = (id: number, camberMm: number, o: Partial<BayCandidate> = {}): BayCandidate => ({ id: `p${String(id).padStart(3, '0')}`, mark: `DT-${id}`, camberMm, sigmaMm: 2, ageDays: 30, committed: false, ...o });

describe('bay matching (exact; README states the objective)', () => {
  it('picks the closest group and orders it by camber', () => {
    const pool = [piece(1, 40), piece(2, 60), piece(3, 42), piece(4, 41), piece(5, 75)];
    const r = proposeBay(pool, { positions: 3, toleranceMm: 19.05 });
    expect(r.feasible).toBe(true);
    expect(r.order.map((p) => p.mark)).toEqual(['DT-1', 'DT-4', 'DT-3']);
    expect(r.marginMm).toBeGreaterThan(0);
  });
  it('ships the oldest pieces when two groups are equally good', () => {
    const pool = [piece(1, 40, { ageDays: 10 }), piece(2, 41, { ageDays: 10 }), piece(3, 80, { ageDays: 90 }), piece(4, 81, { ageDays: 90 })];
    expect(proposeBay(pool, { positions: 2, toleranceMm: 19.05 }).order.map((p) => p.mark)).toEqual(['DT-3', 'DT-4']);
  });
  it('keeps a committed piece even when it widens the worst difference', () => {
    const pool = [piece(1, 40), piece(2, 41), piece(3, 42), piece(4, 55, { committed: true })];
    const r = proposeBay(pool, { positions: 3, toleranceMm: 19.05 });
    expect(r.order.map((p) => p.mark)).toContain('DT-4');
  });
  it('when no arrangement fits, says so with the shortfall, and still proposes the best', () => {
    const pool = [piece(1, 10), piece(2, 40), piece(3, 70)];
    const r = proposeBay(pool, { positions: 3, toleranceMm: 12.7 });
    expect(r.feasible).toBe(false);
    expect(r.marginMm).toBeLessThan(0);
    expect(r.reason).toMatch(/no arrangement keeps every pair of neighbours within the tolerance.*mm over/);
    expect(r.order).toHaveLength(3);
  });
  it('when the pool is too small, says how many pieces there are', () => {
    expect(proposeBay([piece(1, 10)], { positions: 3, toleranceMm: 12.7 }).reason).toMatch(/only 1 suitable pieces for 3 positions/);
  });
  it('matches brute force on random small cases: same worst step, same total age (fast-check)', () => {
    const arb = fc.record({
      cambers: fc.array(fc.integer({ min: 0, max: 120 }), { minLength: 1, maxLength: 9 }),
      ages: fc.array(fc.integer({ min: 1, max: 120 }), { minLength: 9, maxLength: 9 }),
      sigmas: fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 9, maxLength: 9 }),
      committedMask: fc.integer({ min: 0, max: 511 }),
      n: fc.integer({ min: 1, max: 6 }),
    });
    fc.assert(
      fc.property(arb, ({ cambers, ages, sigmas, committedMask, n }) => {
        const pool = cambers.map((c, i) => piece(i, c, { ageDays: ages[i]!, sigmaMm: sigmas[i]!, committed: ((committedMask >> i) & 1) === 1 && i % 3 === 0 }));
        const expected = brute(pool, n);
        const got = proposeBay(pool, { positions: n, toleranceMm: 19.05 });
        if (!expected) return got.order.length === 0;
        const worst = Math.max(0, ...got.order.slice(1).map((x, i) => neighbourSteps(got.order[i]!, x, 1, RES)));
        const age = got.order.reduce((a, x) => a + x.ageDays, 0);
        return got.order.length === n && worst === expected.worst && age === expected.age && pool.filter((p) => p.committed).every((p) => got.order.includes(p));
      }),
      { numRuns: 500 },
    );
  });
  it('the proposal never exceeds the best achievable worst difference found by brute force', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 150, noNaN: true }), { minLength: 3, maxLength: 10 }), fc.integer({ min: 2, max: 5 }), (cambers, n) => {
        fc.pre(n <= cambers.length);
        const pool = cambers.map((c, i) => piece(i, c));
        const expected = brute(pool, n)!;
        return proposeBay(pool, { positions: n, toleranceMm: 1 }).worstMm <= expected.worst * RES + 1e-9;
      }),
      { numRuns: 300 },
    );
  });
  it('solves a 40-position bay from a 200-piece pool (time printed by npm run bench:bays)', () => {
    const pool = Array.from({ length: 200 }, (_, i) => piece(i, 40 + ((i * 7919) % 400) / 10, { ageDays: 5 + (i % 90), committed: i === 17 || i === 123 }));
    const r = proposeBay(pool, { positions: 40, toleranceMm: 19.05 });
    expect(r.order).toHaveLength(40);
    expect(r.order.filter((p) => p.committed)).toHaveLength(2);
    expect(r.differencesMm.every((d) => d <= r.worstMm + 1e-9)).toBe(true);
  });
});
