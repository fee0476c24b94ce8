import { describe, expect, it } from 'vitest';
import { calibrate, type CalibrationOptions } from '#shared/camber/calibrate';

// A simple member curve: elastic part 1.0 in, growth rising to 1.2 in (shape of a creep curve).
const parts = (age: number): { elastic: number; growth: number } => ({ elastic: 1.0, growth: 1.2 * (age ** 0.6 / (10 + age ** 0.6)) });
const opts: CalibrationOptions = { elastic: { mean: 1, sd: 0.1 }, growth: { mean: 1, sd: 0.3 }, measurementSd: 0.125, distorted: 'exclude', fitElastic: true, z: 1.6449 };
const truth = (age: number): number => 0.92 * parts(age).elastic + 1.5 * parts(age).growth;

describe('per-piece calibration (conjugate normal linear model, Gelman et al. BDA 3rd ed. §14.2)', () => {
  it('with no readings the posterior is the product-family prior', () => {
    const c = calibrate(parts, [], opts);
    expect(c.elastic.mean).toBeCloseTo(1, 12);
    expect(c.growth.mean).toBeCloseTo(1, 12);
    expect(c.growth.sd).toBeCloseTo(0.3, 12);
    expect(c.note).toMatch(/prior alone/);
  });
  it('matches the one-parameter closed form μ = (μ0/τ² + Σx·y/σ²)/(1/τ² + Σx²/σ²) when the elastic factor is fixed', () => {
    const readings = [7, 28, 60].map((a) => ({ ageDays: a, camber: 1 + 1.3 * parts(a).growth }));
    const c = calibrate(parts, readings, { ...opts, fitElastic: false });
    const s2 = 0.125 ** 2;
    let num = 1 / 0.09;
    let den = 1 / 0.09;
    for (const r of readings) {
      const x = parts(r.ageDays).growth;
      num += (x * (r.camber - 1)) / s2;
      den += (x * x) / s2;
    }
    expect(c.growth.mean).toBeCloseTo(num / den, 6);
    expect(c.growth.sd).toBeCloseTo(Math.sqrt(1 / den), 4);
  });
  it('recovers the factors of a piece that creeps more than predicted, and the band narrows as readings accrue', () => {
    const ages = [1, 3, 7, 14, 21, 28, 42, 56, 70, 90, 120, 150];
    let lastSd = Infinity;
    for (let n = 2; n <= ages.length; n += 2) {
      const c = calibrate(parts, ages.slice(0, n).map((a) => ({ ageDays: a, camber: truth(a) })), opts);
      expect(c.growth.sd).toBeLessThan(lastSd);
      lastSd = c.growth.sd;
    }
    const all = calibrate(parts, ages.map((a) => ({ ageDays: a, camber: truth(a) })), opts);
    expect(all.growth.mean).toBeGreaterThan(1.3);
    const at = all.at(parts(200));
    expect(at.low).toBeLessThan(truth(200));
    expect(at.high).toBeGreaterThan(truth(200));
  });
  it('a reading taken in afternoon sun is left out, and says so', () => {
    const base = [7, 28, 56].map((a) => ({ ageDays: a, camber: truth(a) }));
    const withSun = [...base, { ageDays: 60, camber: truth(60) + 0.6, distorted: true }];
    const a = calibrate(parts, base, opts);
    const b = calibrate(parts, withSun, opts);
    expect(b.growth.mean).toBeCloseTo(a.growth.mean, 12);
    expect(b.excludedDistorted).toBe(1);
    expect(b.note).toMatch(/1 taken in sun left out/);
  });
  it('down-weighted sun readings pull less than ordinary ones', () => {
    const base = [7, 28, 56].map((a) => ({ ageDays: a, camber: truth(a) }));
    const shifted = { ageDays: 60, camber: truth(60) + 0.6 };
    const asOrdinary = calibrate(parts, [...base, shifted], { ...opts, distorted: 'downweight' });
    const asSun = calibrate(parts, [...base, { ...shifted, distorted: true }], { ...opts, distorted: 'downweight' });
    const clean = calibrate(parts, base, opts);
    expect(Math.abs(asSun.growth.mean - clean.growth.mean)).toBeLessThan(Math.abs(asOrdinary.growth.mean - clean.growth.mean));
  });
});
