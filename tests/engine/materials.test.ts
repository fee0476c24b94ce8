import { describe, expect, it } from 'vitest';
import { developmentLengthAci, ecAashto2014, ecAashto2015, ecAci318, ecAci318Normal, ecmEn1992, eciMc2010, frAashto, frAci318, strengthRatioAci209, transferLengthAciStress, transferLengthIn } from '#shared/camber/materials';
import { sectionFromShape } from '#shared/camber/section';
import { DEFAULT_TOLERANCE_RULES, toleranceFor } from '#shared/camber/tolerance';

// Check values A1–A10 and H1–H2 of the engineering reference ("Check values for tests").
describe('concrete modulus (engineering reference §1.4)', () => {
  it('A1 ACI 318-19 §19.2.2.1(a), wc = 145 lb/ft³, f′c = 5,000 psi → 4,074,281 psi', () => {
    expect(ecAci318(5000, 145)).toBeCloseTo(4074281, -1);
  });
  it('A2 ACI 318-19 §19.2.2.1(b) 57,000·√5,000 → 4,030,509 psi', () => {
    expect(Math.abs(ecAci318Normal(5000) - 4030509)).toBeLessThan(1);
  });
  it('A3 AASHTO (2015+) Eq. 5.4.2.4-1: 4 ksi → 3,986.5; 5 ksi → 4,291.2; 7 ksi, wc 0.147 → 4,928.3 ksi', () => {
    expect(Math.abs(ecAashto2015(4, 0.145) - 3986.5)).toBeLessThan(0.2);
    expect(Math.abs(ecAashto2015(5, 0.145) - 4291.2)).toBeLessThan(0.2);
    expect(Math.abs(ecAashto2015(7, 0.147) - 4928.3)).toBeLessThan(0.2);
  });
  it('A4 AASHTO (≤ 2014) 33,000·wc^1.5·√f′c, wc = 0.145, 5 ksi → 4,074.3 ksi', () => {
    expect(Math.abs(ecAashto2014(5, 0.145) - 4074.3)).toBeLessThan(0.2);
  });
  it('A5 BT84 worked example (third-party slides, SRC): Eci = 0.70·33,000·0.145^1.5·√7.00 → 3,374 ksi', () => {
    expect(Math.abs(0.7 * ecAashto2014(7, 0.145) - 3374.5)).toBeLessThan(1);
  });
  it('A6 EN 1992-1-1 Table 3.1 Ecm: C30/37 → 33, C40/50 → 35, C50/60 → 37 GPa (table values, rounded)', () => {
    expect(Math.round(ecmEn1992(30))).toBe(33);
    expect(Math.round(ecmEn1992(40))).toBe(35);
    expect(Math.round(ecmEn1992(50))).toBe(37);
  });
  it('A7 fib MC2010 Table 5.1-7 Eci (quartzite): C30 → 33.6, C40 → 36.3, C50 → 38.6 GPa [MEM-M]', () => {
    expect(eciMc2010(30)).toBeCloseTo(33.6, 1);
    expect(eciMc2010(40)).toBeCloseTo(36.3, 1);
    expect(eciMc2010(50)).toBeCloseTo(38.6, 1);
  });
  it('A8 modulus of rupture: ACI 7.5·√5,000 → 530.3 psi; AASHTO 0.24·√5 → 0.537 ksi', () => {
    expect(frAci318(5000)).toBeCloseTo(530.3, 1);
    expect(frAashto(5)).toBeCloseTo(0.537, 3);
  });
  it('A9 transfer and development, 0.5-in strand, fse = 150 ksi, fps = 260 ksi: ACI ℓtr 25.0 in; AASHTO 60·db 30.0 in (0.6 in → 36.0); ACI ℓd 80.0 in', () => {
    expect(transferLengthAciStress(150000, 0.5)).toBeCloseTo(25, 9);
    expect(transferLengthIn('aashto', 0.5)).toBeCloseTo(30, 9);
    expect(transferLengthIn('aashto', 0.6)).toBeCloseTo(36, 9);
    expect(transferLengthIn('aci', 0.5)).toBeCloseTo(25, 9);
    expect(developmentLengthAci(150000, 260000, 0.5)).toBeCloseTo(80, 9);
  });
  it('A10 ACI 209R-92 Eq. 2-1 strength ratio: steam Type III at 1 d → 0.5952; moist Type I at 7 d → 0.7035', () => {
    expect(strengthRatioAci209(1, 'steam', 'III')).toBeCloseTo(0.5952, 4);
    expect(strengthRatioAci209(7, 'moist', 'I')).toBeCloseTo(0.7035, 4);
  });
});

describe('section properties from dimensions (parallel-axis theorem; textbook formulas, common practice)', () => {
  it('a rectangle 12 × 24 in has A = 288 in², I = bh³/12 = 13,824 in⁴, yb = 12 in', () => {
    const s = sectionFromShape({ shape: 'rectangle', width: 12, height: 24 });
    expect(s.area).toBeCloseTo(288, 9);
    expect(s.inertia).toBeCloseTo(13824, 6);
    expect(s.yb).toBeCloseTo(12, 9);
    expect(s.volumeToSurface).toBeCloseTo(288 / 72, 9);
  });
  it('an I-girder of equal flanges has its centroid at mid-height', () => {
    const s = sectionFromShape({ shape: 'i-girder', topFlangeWidth: 20, topFlangeThickness: 6, webWidth: 6, bottomFlangeWidth: 20, bottomFlangeThickness: 6, height: 48 });
    expect(s.yb).toBeCloseTo(24, 9);
    // Two flanges and a web: Σ(b·h³/12 + A·d²)
    const expected = 2 * ((20 * 6 ** 3) / 12 + 120 * 21 ** 2) + (6 * 36 ** 3) / 12;
    expect(s.inertia).toBeCloseTo(expected, 6);
  });
  it('hollow-core voids remove area and inertia: A = b·h − n·πd²/4', () => {
    const s = sectionFromShape({ shape: 'hollow-core', width: 48, height: 8, voidCount: 6, voidDiameter: 5.5 });
    expect(s.area).toBeCloseTo(48 * 8 - (6 * Math.PI * 5.5 ** 2) / 4, 9);
    expect(s.inertia).toBeCloseTo((48 * 8 ** 3) / 12 - (6 * Math.PI * 5.5 ** 4) / 64, 6);
  });
});

describe('tolerance rules as data (engineering reference §5.1, check values H1–H2; MEM-M/MEM-L values)', () => {
  it('H1 double tee ±1/4 in per 10 ft capped at ±3/4 in: 20 ft → 0.50, 30 ft → 0.75, 60 ft → 0.75', () => {
    const r = DEFAULT_TOLERANCE_RULES['double-tee'];
    expect(toleranceFor(r, 20)).toBeCloseTo(0.5, 9);
    expect(toleranceFor(r, 30)).toBeCloseTo(0.75, 9);
    expect(toleranceFor(r, 60)).toBeCloseTo(0.75, 9);
  });
  it('H2 I-girder ±1/8 in per 10 ft, cap 1/2 in (≤ 80 ft) or 1 in (> 80 ft): 60 ft → 0.50, 120 ft → 1.00', () => {
    const r = DEFAULT_TOLERANCE_RULES['i-girder'];
    expect(toleranceFor(r, 60)).toBeCloseTo(0.5, 9);
    expect(toleranceFor(r, 120)).toBeCloseTo(1.0, 9);
  });
});
