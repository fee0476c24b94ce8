// Service check: final camber with superimposed dead load, bottom-fibre stress against the modulus
// of rupture, live-load deflection with an effective moment of inertia where the section cracks, and
// the deflection limits of ACI 318-19 Table 24.2.2. US units inside.
import { camberAt, lossFraction, timelineOf } from './growth';
import { EP_KSI, frAci318 } from './materials';
import type { PreparedMember } from './prepare';
import type { ServiceResult } from './schema';

/** ACI 318-19 Table 24.2.2 maximum permissible computed deflections. [MEM-H] */
export const DEFLECTION_LIMITS = {
  'flat-roof': { divisor: 180, rule: 'ACI 318-19 Table 24.2.2: flat roofs not supporting damageable elements, live load, ℓ/180' },
  floor: { divisor: 360, rule: 'ACI 318-19 Table 24.2.2: floors not supporting damageable elements, live load, ℓ/360' },
  'supports-damageable': { divisor: 480, rule: 'ACI 318-19 Table 24.2.2: supporting elements likely damaged by deflection, after attachment, ℓ/480' },
  'supports-nondamageable': { divisor: 240, rule: 'ACI 318-19 Table 24.2.2: supporting elements not likely damaged, after attachment, ℓ/240' },
} as const;

/**
 * Cracked moment of inertia of a prestressed section, PCI Design Handbook approximation
 * Icr = n·Aps·dp²·(1 − 1.6·√(n·ρp)) [MEM-M].
 */
export const crackedInertia = (n: number, aps: number, dp: number, b: number): number => {
  const rho = aps / (b * dp);
  return Math.max(0, n * aps * dp * dp * (1 - 1.6 * Math.sqrt(n * rho)));
};

/**
 * Effective inertia of a cracked prestressed member, PCI Design Handbook bilinear form [MEM-M]:
 * (Mcr/Ma) = 1 − (ftl − fr)/fl; Ie = (Mcr/Ma)³·Ig + [1 − (Mcr/Ma)³]·Icr ≤ Ig.
 */
export function effectiveInertia(ig: number, icr: number, ftl: number, fr: number, fl: number): number {
  if (ftl <= fr || fl <= 0) return ig;
  const ratio = Math.min(1, Math.max(0, 1 - (ftl - fr) / fl));
  return Math.min(ig, ratio ** 3 * ig + (1 - ratio ** 3) * icr);
}

export function serviceCheck(m: PreparedMember, s: { superimposedDead: number; live: number; use: keyof typeof DEFLECTION_LIMITS; finalAgeDays: number }, atAgeDays: number): ServiceResult {
  const si = m.input.units === 'si';
  const q = (x: number): number => (si ? x / 4.4482216152605 / 39.37007874015748 : x / 12);
  const qSdl = q(s.superimposedDead);
  const qLl = q(s.live);
  const L = m.lengthIn;
  const { inertia: ig, area: ag, yb, height } = m.section;
  const tl = timelineOf(m);
  // In service the member sits on its bearings, taken at the ends; the dead load goes on at `atAgeDays`.
  tl.supports = [...tl.supports.filter((e) => e.ageDays < atAgeDays), { ageDays: atAgeDays, overhangIn: 0 }];
  if (qSdl > 0) tl.loads = [...tl.loads.filter((e) => e.ageDays < atAgeDays), { ageDays: atAgeDays, kipPerIn: qSdl }];
  const final = camberAt(m, tl, s.finalAgeDays);
  const eAt = m.modulusAt(atAgeDays);
  const sdlElastic = (5 * qSdl * L ** 4) / (384 * eAt * ig);
  const sdlLong = sdlElastic * (1 + m.model.creep(s.finalAgeDays, atAgeDays));

  const pe = m.forceAfterRelease * (1 - lossFraction(m, s.finalAgeDays));
  const e = m.eccMidAvg;
  const mOf = (w: number): number => (w * L * L) / 8;
  const msw = mOf(m.selfWeightKipPerIn);
  const fl = (mOf(qLl) * yb) / ig;
  const fb = -pe / ag - (pe * e * yb) / ig + ((msw + mOf(qSdl)) * yb) / ig + fl; // tension positive, ksi
  const fr = frAci318(m.fcKsi * 1000) / 1000;
  const cracked = fb > fr;
  const n = EP_KSI / m.ec28;
  const dp = height - yb + e;
  const b = m.widthIn ?? ag / height;
  const ie = cracked ? effectiveInertia(ig, crackedInertia(n, m.strandArea, dp, b), fb, fr, fl) : ig;
  const llDefl = (5 * qLl * L ** 4) / (384 * m.ec28 * ie);
  const lim = DEFLECTION_LIMITS[s.use];
  const limit = L / lim.divisor;
  const governing = s.use === 'flat-roof' || s.use === 'floor' ? llDefl : llDefl + (sdlLong - sdlElastic);
  const k = si ? 25.4 : 1;
  const stressK = si ? 6.894757293168 : 1;
  return {
    finalCamber: final.camber * k,
    superimposedDeadDeflection: sdlLong * k,
    liveLoadDeflection: llDefl * k,
    bottomStress: fb * stressK,
    modulusOfRupture: fr * stressK,
    cracked,
    effectiveInertia: si ? ie * 25.4 ** 4 : ie,
    limit: limit * k,
    limitRule: lim.rule,
    passes: governing <= limit,
  };
}
