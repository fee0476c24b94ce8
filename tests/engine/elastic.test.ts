import { describe, expect, it } from 'vitest';
import { debondedCamber, harp1Camber, harp2Camber, insetChordCamber, straightCamber, uniformEndSupports, uniformInsetEndChord, uniformInsetSupports, camberFromElevations } from '#shared/camber/closed-forms';
import { chordOffset, prestressCamber, selfWeightDeflection, selfWeightMoment, type StrandGroupModel } from '#shared/camber/elastic';

// Check values B1–B8 of the team's engineering reference ("Check values for tests", section B): closed
// forms from the PCI Design Handbook camber equations [MEM-H] and moment-area derivations [CALC].
// Each is asserted twice: the closed form, and the general curvature integrator that the product uses.
const P = 1000; // kip
const L = 1200; // in
const E = 4000; // ksi
const I = 100000; // in⁴
const group = (g: Partial<StrandGroupModel>): StrandGroupModel => ({ force: P, profile: 'straight', eccEnd: 20, eccMid: 20, transferLength: 0, ...g });

describe('elastic camber at release (engineering reference §1.2, check values B1–B4)', () => {
  it('B1 straight strands, e = 20 in → 9.000 in', () => {
    expect(straightCamber(P, 20, L, E, I)).toBeCloseTo(9.0, 6);
    expect(prestressCamber([group({})], L, E, I)).toBeCloseTo(9.0, 6);
  });
  it('B2 single-point harp, e_end = 5, e_centre = 20 → 6.750 in', () => {
    expect(harp1Camber(P, 5, 20, L, E, I)).toBeCloseTo(6.75, 6);
    expect(prestressCamber([group({ profile: 'harped-1', eccEnd: 5 })], L, E, I)).toBeCloseTo(6.75, 6);
  });
  it('B3 two-point harp at a = 480 in → 7.560 in', () => {
    expect(harp2Camber(P, 5, 20, 480, L, E, I)).toBeCloseTo(7.56, 6);
    expect(prestressCamber([group({ profile: 'harped-2', eccEnd: 5, harpAt: 480 })], L, E, I)).toBeCloseTo(7.56, 6);
  });
  it('B4 debonded 60 in with transfer 30 in → 8.8575 in; transfer only → 8.9925 in', () => {
    expect(debondedCamber(P, 20, 60, 30, L, E, I)).toBeCloseTo(8.8575, 6);
    expect(prestressCamber([group({ debondLength: 60, transferLength: 30 })], L, E, I)).toBeCloseTo(8.8575, 6);
    expect(debondedCamber(P, 20, 0, 30, L, E, I)).toBeCloseTo(8.9925, 6);
    expect(prestressCamber([group({ transferLength: 30 })], L, E, I)).toBeCloseTo(8.9925, 6);
  });
  it('harped and debonded groups together equal the sum of their closed forms (superposition)', () => {
    const mixed = prestressCamber([group({ force: 600, debondLength: 60, transferLength: 30 }), group({ force: 400, profile: 'harped-2', eccEnd: 5, harpAt: 480 })], L, E, I);
    const sum = debondedCamber(600, 20, 60, 30, L, E, I) + harp2Camber(400, 5, 20, 480, L, E, I);
    expect(mixed).toBeCloseTo(sum, 8);
  });
});

describe('self-weight deflection (engineering reference §1.3, check value B5)', () => {
  const w = 1; // kip/in, deliberately large to expose formula errors
  it('end supports → 67.5000 in', () => {
    expect(uniformEndSupports(w, L, E, I)).toBeCloseTo(67.5, 5);
    expect(selfWeightDeflection(w, L, 0, E, I)).toBeCloseTo(67.5, 5);
  });
  it('dunnage inset 24 in → 61.023456 in on the end chord, 57.211453 in relative to the supports', () => {
    expect(uniformInsetEndChord(w, L, 24, E, I)).toBeCloseTo(61.023456, 5);
    expect(selfWeightDeflection(w, L, 24, E, I)).toBeCloseTo(61.023456, 5);
    expect(uniformInsetSupports(w, L, 24, E, I)).toBeCloseTo(57.211453, 5);
  });
  it('dunnage inset 120 in → 35.532000 in (end chord) and 25.574400 in (supports)', () => {
    expect(selfWeightDeflection(w, L, 120, E, I)).toBeCloseTo(35.532, 5);
    expect(uniformInsetSupports(w, L, 120, E, I)).toBeCloseTo(25.5744, 5);
    // Relative to the supports = end-chord midspan offset minus the offset of the support points.
    const atSupport = chordOffset((x) => -selfWeightMoment(w, L, 120, x) / (E * I), L, 120, [120, L - 120]);
    expect(-selfWeightDeflection(w, L, 120, E, I) - atSupport).toBeCloseTo(-25.5744, 5);
  });
  it('the self-weight moment is zero at the free ends and balanced at midspan (statics)', () => {
    expect(selfWeightMoment(w, L, 120, 0)).toBeCloseTo(0, 12);
    expect(selfWeightMoment(w, L, 120, L)).toBeCloseTo(0, 6);
    expect(selfWeightMoment(w, L, 0, L / 2)).toBeCloseTo((w * L * L) / 8, 6);
  });
});

describe('measured camber geometry (engineering reference §1.1, check values B6–B8)', () => {
  it('B6 camber from elevations 100.000 / 100.120 / 102.260 → 2.200', () => {
    expect(camberFromElevations(100, 100.12, 102.26)).toBeCloseTo(2.2, 9);
  });
  it('B7 parabolic chord conversion, C = 2.0 in, L = 100 ft, inset 1.5 ft → 1.8818 in', () => {
    expect(insetChordCamber(2.0, 1200, 18)).toBeCloseTo(1.8818, 4);
  });
  it('B8 double-tee-like case: Δps = 4.8600, Δsw = 2.1870, net 2.6730 in', () => {
    const dps = prestressCamber([{ force: 500, profile: 'straight', eccEnd: 12, eccMid: 12, transferLength: 0 }], 720, 4000, 20000);
    const dsw = selfWeightDeflection(0.6 / 12, 720, 0, 4000, 20000);
    expect(dps).toBeCloseTo(4.86, 4);
    expect(dsw).toBeCloseTo(2.187, 4);
    expect(dps - dsw).toBeCloseTo(2.673, 4);
  });
});
