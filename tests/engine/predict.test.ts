import { readFileSync, readdirSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { harp1Camber, uniformEndSupports } from '#shared/camber/closed-forms';
import { chordOffset, groupBreakpoints, prestressMoment, type StrandGroupModel } from '#shared/camber/elastic';
import { predict } from '#shared/camber/predict';
import { METHODS, type PredictInput } from '#shared/camber/schema';
import { ecAci318 } from '#shared/camber/materials';

const example = (): PredictInput => JSON.parse(readFileSync('shared/camber/examples/double-tee-harped.json', 'utf8'));

describe('prediction of the issue example (double tee, single-point harp, ACI 209R-92)', () => {
  const r = predict(example());
  it('release camber matches the closed forms with Eci by ACI 318-19 §19.2.2.1(a)', () => {
    const eci = ecAci318(3800, 150) / 1000;
    const L = 54 * 12;
    const w = ((480 / 144) * 150) / 1000 / 12;
    // 10 strands of 0.5 in: AASHTO 60·db transfer length barely changes a bonded member (reference §1.2).
    expect(r.release.prestress).toBeCloseTo(harp1Camber(285, 4, 13, L, eci, 21000), 2);
    expect(r.release.selfWeight).toBeCloseTo(uniformEndSupports(w, L, eci, 21000), 9);
    expect(r.release.net).toBeCloseTo(r.release.prestress - r.release.selfWeight, 12);
  });
  it('reports every requested age with band, tolerance, creep coefficient and loss', () => {
    expect(r.points.map((p) => p.ageDays)).toEqual([1, 7, 28, 60, 90, 180, 365]);
    for (const p of r.points) {
      expect(p.low).toBeLessThanOrEqual(p.camber);
      expect(p.high).toBeGreaterThanOrEqual(p.camber);
      expect(p.toleranceHigh - p.camber).toBeCloseTo(0.75, 9); // 54 ft double tee: min(1/4·5.4, 3/4) (H1 rule)
    }
    expect(r.points[0]!.creepCoefficient).toBe(0);
    expect(r.points.at(-1)!.creepCoefficient).toBeGreaterThan(r.points[2]!.creepCoefficient);
    expect(r.points.at(-1)!.prestressLoss).toBeGreaterThan(0);
  });
  it('camber grows with age in storage (creep of the prestress dominates)', () => {
    const c = r.points.map((p) => p.camber);
    for (let i = 1; i < c.length; i++) expect(c[i]!).toBeGreaterThan(c[i - 1]!);
  });
  it('carries the caution and names its sources', () => {
    expect(r.caution).toMatch(/does not replace, the engineer of record/);
    expect(r.sources[0]).toMatch(/ACI 209R-92/);
  });
});

describe('every method and profile runs (engineering reference §2–3)', () => {
  it.each(METHODS)('method %s gives a growing curve', (method) => {
    const r = predict({ ...example(), method });
    expect(r.points.at(-1)!.camber).toBeGreaterThan(r.release.net);
    if (method === 'multipliers') {
      // C1 form on this member's release values
      expect(r.multipliers!.erection).toBeCloseTo(1.8 * r.release.prestress - 1.85 * r.release.selfWeight, 9);
      expect(r.multipliers!.final).toBeCloseTo(2.45 * r.release.prestress - 2.7 * r.release.selfWeight, 9);
    }
  });
  it.each([
    { profile: 'straight', eccMid: 13 },
    { profile: 'harped-1', eccEnd: 4, eccMid: 13 },
    { profile: 'harped-2', eccEnd: 4, eccMid: 13, harpAt: 21.6 },
    { profile: 'straight', eccMid: 13, debondLength: 3 },
  ] as const)('profile %o', (g) => {
    const r = predict({ ...example(), strands: [{ count: 10, area: 0.153, ...g }] });
    expect(r.release.prestress).toBeGreaterThan(0);
  });
  it('a debonded group cambers less than the same group fully bonded', () => {
    const bonded = predict({ ...example(), strands: [{ count: 10, area: 0.153, profile: 'straight', eccMid: 13 }] });
    const debonded = predict({ ...example(), strands: [{ count: 10, area: 0.153, profile: 'straight', eccMid: 13, debondLength: 6 }] });
    expect(debonded.release.prestress).toBeLessThan(bonded.release.prestress);
  });
  it('jacking stress instead of force: elastic shortening is computed (AASHTO C5.9.3.2.3a)', () => {
    const r = predict({ ...example(), prestress: { jackingStress: 202.5 } });
    expect(r.prestress.elasticShorteningLoss).toBeGreaterThan(5);
    expect(r.prestress.forceAfterRelease).toBeLessThan(r.prestress.jackingForce!);
  });
  it('storage on dunnage raises camber over the bed value (reference §6.3)', () => {
    const onBed = predict({ ...example(), supports: { storage: [] } });
    const onDunnage = predict(example());
    expect(onDunnage.points[3]!.camber).toBeGreaterThan(onBed.points[3]!.camber);
  });
  it('a topping placed at 60 days lowers later camber', () => {
    const without = predict(example());
    const withTopping = predict({ ...example(), loads: [{ ageDays: 60, load: 0.4, label: 'topping' }] });
    expect(withTopping.points[4]!.camber).toBeLessThan(without.points[4]!.camber);
    expect(withTopping.points[2]!.camber).toBeCloseTo(without.points[2]!.camber, 12);
  });
  it('the service check compares live-load deflection with ACI 318-19 Table 24.2.2', () => {
    const r = predict({ ...example(), service: { superimposedDead: 0.1, live: 0.2, use: 'floor' } });
    expect(r.service!.limit).toBeCloseTo((54 * 12) / 360, 9);
    expect(r.service!.modulusOfRupture).toBeCloseTo((7.5 * Math.sqrt(5500)) / 1000, 9);
    expect(typeof r.service!.passes).toBe('boolean');
  });
});

describe('SI input gives the same answer as US input', () => {
  it('the example converted to SI predicts the same camber in mm', () => {
    const us = predict(example());
    const si = predict({
      units: 'si', length: 54 * 0.3048,
      section: { area: 480 * 645.16, inertia: 21000 * 25.4 ** 4, yb: 17.5 * 25.4, height: 24 * 25.4, volumeToSurface: 1.9 * 25.4 },
      concrete: { fci: 3.8 * 6.894757293168, fc: 5.5 * 6.894757293168, unitWeight: 150 * 16.01846337396, modulus: 'aci318', curing: 'steam', releaseAgeDays: 1 },
      strands: [{ count: 10, area: 0.153 * 645.16, profile: 'harped-1', eccEnd: 4 * 25.4, eccMid: 13 * 25.4 }],
      prestress: { forceAfterRelease: 285 * 4.4482216152605 },
      supports: { storage: [{ fromAgeDays: 1, overhang: 2 * 0.3048 }] },
      environment: { relativeHumidity: 70 }, method: 'aci209', agesDays: [1, 7, 28, 60, 90, 180, 365],
    });
    expect(si.unitOfCamber).toBe('mm');
    us.points.forEach((p, i) => expect(si.points[i]!.camber / 25.4).toBeCloseTo(p.camber, 6));
  });
});

describe('bad input names the field', () => {
  it('a harped group without end eccentricity is refused at strands.0.eccEnd', () => {
    try {
      predict({ ...example(), strands: [{ count: 10, area: 0.153, profile: 'harped-1', eccMid: 13 }] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ZodError);
      expect((e as ZodError).issues[0]!.path).toEqual(['strands', 0, 'eccEnd']);
    }
  });
  it('an overhang longer than half the piece is refused', () => {
    expect(() => predict({ ...example(), supports: { storage: [{ fromAgeDays: 2, overhang: 30 }] } })).toThrow(/overhang/);
  });
});

describe('the examples folder all predicts', () => {
  const files = readdirSync('shared/camber/examples').filter((f) => f.endsWith('.json'));
  it.each(files)('%s', (f) => {
    const r = predict(JSON.parse(readFileSync(`shared/camber/examples/${f}`, 'utf8')));
    expect(r.points.length).toBeGreaterThan(0);
  });
});

describe('engine properties (fast-check)', () => {
  const L = 720;
  const g = (p: number, e: number): StrandGroupModel => ({ force: p, profile: 'harped-1', eccEnd: e / 3, eccMid: e, transferLength: 30 });
  const camber = (groups: StrandGroupModel[], E: number): number => chordOffset((x) => prestressMoment(groups, x, L) / (E * 20000), L, L / 2, [30, L - 30]);
  it('prestress camber is linear in the force', () => {
    fc.assert(fc.property(fc.double({ min: 10, max: 2000, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }), (p, k) => {
      const a = camber([g(p, 10)], 4000);
      return Math.abs(camber([g(p * k, 10)], 4000) - k * a) <= 1e-9 * Math.max(1, Math.abs(k * a));
    }), { numRuns: 1000 });
  });
  it('prestress camber grows with eccentricity and falls with modulus', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 30, noNaN: true }), fc.double({ min: 0.1, max: 5, noNaN: true }), fc.double({ min: 2000, max: 8000, noNaN: true }), (e, de, E) => {
      return camber([g(500, e + de)], E) > camber([g(500, e)], E) && camber([g(500, e)], E * 1.1) < camber([g(500, e)], E);
    }), { numRuns: 1000 });
  });
  it('a symmetric member has a symmetric deflected shape', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: L / 2 - 1, noNaN: true }), (x) => {
      const groups = [g(500, 12), { ...g(300, 8), profile: 'harped-2' as const, harpAt: 250, debondLength: 20 }];
      const breaks = groups.flatMap((gr) => groupBreakpoints(gr, L));
      const left = chordOffset((xi) => prestressMoment(groups, xi, L) / (4000 * 20000), L, x, breaks);
      const right = chordOffset((xi) => prestressMoment(groups, xi, L) / (4000 * 20000), L, L - x, breaks);
      return Math.abs(left - right) < 1e-9;
    }), { numRuns: 500 });
  });
  it('the expected band always contains the predicted curve', () => {
    fc.assert(fc.property(fc.constantFrom(...METHODS), fc.double({ min: 2, max: 20, noNaN: true }), fc.integer({ min: 4, max: 30 }), (method, ecc, count) => {
      const r = predict({ ...example(), method, strands: [{ count, area: 0.153, profile: 'straight', eccMid: ecc }], prestress: {}, agesDays: [1, 3, 10, 30, 100, 400, 800] });
      return r.points.every((p) => p.low <= p.camber && p.camber <= p.high && p.toleranceLow <= p.camber && p.camber <= p.toleranceHigh);
    }), { numRuns: 200 });
  });
});
