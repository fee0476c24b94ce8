import { create, all } from 'mathjs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { KG_M3_PER_PCF, KN_PER_KIP, MPA_PER_PSI, in4ToMm4, inToMm, ksiToMpa, mmToIn, mpaToKsi, mToIn, inToM } from '#shared/camber/units';

// Outside reference: mathjs 15.2.0 unit conversion (engineering reference §8.3 and check values I1–I2).
const math = create(all ?? {});
math.createUnit('ksi', '1000 psi');
const conv = (v: number, from: string, to: string): number => math.unit(v, from).toNumber(to);
// mathjs rounds some definitions (its kip is 4.4482216 kN), so agreement is asserted to 1e-7 relative.
const agrees = (ours: number, theirs: number): boolean => Math.abs(ours / theirs - 1) < 1e-7;

describe('unit factors against mathjs and check values I1–I2', () => {
  it('I1 1 psi = 6,894.757293168 Pa; 5,000 psi → 34.473786 MPa', () => {
    expect(MPA_PER_PSI * 1e6).toBeCloseTo(6894.757293168, 6);
    expect(5000 * MPA_PER_PSI).toBeCloseTo(34.473786, 6);
    expect(agrees(5000 * MPA_PER_PSI, conv(5000, 'psi', 'MPa'))).toBe(true);
  });
  it('I2 1 kip = 4.4482216 kN; 145 lb/ft³ = 2,322.677 kg/m³; 710,000 in⁴ = 2.95524×10¹¹ mm⁴', () => {
    expect(agrees(KN_PER_KIP, conv(1, 'kip', 'kN'))).toBe(true);
    expect(145 * KG_M3_PER_PCF).toBeCloseTo(2322.677, 3);
    expect(agrees(145 * KG_M3_PER_PCF, conv(145, 'lb/ft^3', 'kg/m^3'))).toBe(true);
    expect(in4ToMm4(710000) / 1e11).toBeCloseTo(2.95524, 5);
  });
  it('ksi and inches agree with mathjs', () => {
    expect(agrees(ksiToMpa(6), conv(6, 'ksi', 'MPa'))).toBe(true);
    expect(inToMm(1)).toBe(25.4);
    expect(agrees(inToMm(3.5), conv(3.5, 'inch', 'mm'))).toBe(true);
  });
  it('round trips are exact to 1e-9 (fast-check)', () => {
    fc.assert(fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (x) => {
      const tol = 1e-9 * Math.max(1, Math.abs(x));
      return Math.abs(mmToIn(inToMm(x)) - x) <= tol && Math.abs(mpaToKsi(ksiToMpa(x)) - x) <= tol && Math.abs(inToM(mToIn(x)) - x) <= tol;
    }), { numRuns: 2000 });
  });
});
