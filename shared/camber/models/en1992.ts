// EN 1992-1-1:2004 Annex B (creep, Eqs. B.1–B.10) and §3.1.4 (shrinkage, Eqs. 3.8–3.13).
// [MEM-H]; checked against the test values of fib-international/structuralcodes (engineering reference
// §3.4 and check value D11). SI inside: MPa, mm, days.
import { MM_PER_IN, MPA_PER_KSI } from '../units';
import { adjustedLoadingAge, temperatureAdjustedAge } from './mc2010';
import type { CreepShrinkageModel, ModelInputs } from './types';

const ALPHA = { S: -1, N: 0, R: 1 } as const;
const ADS = { S: [3, 0.13], N: [4, 0.12], R: [6, 0.11] } as const;

export interface En1992Params {
  fcm: number;
  h0: number;
  rh: number;
  cementClass: 'S' | 'N' | 'R';
}

/** φ(t, t0) (Eq. B.1), relative to the tangent modulus Ec = 1.05·Ecm; t0T temperature-adjusted. */
export function en1992Creep(p: En1992Params, t: number, t0: number, t0T = t0): number {
  if (t <= t0) return 0;
  const { fcm, h0, rh } = p;
  const a1 = (35 / fcm) ** 0.7;
  const a2 = (35 / fcm) ** 0.2;
  const a3 = (35 / fcm) ** 0.5;
  const base = (1 - rh / 100) / (0.1 * Math.cbrt(h0));
  const phiRh = fcm <= 35 ? 1 + base : (1 + base * a1) * a2; // B.3a/B.3b
  const bFcm = 16.8 / Math.sqrt(fcm); // B.4
  const t0adj = adjustedLoadingAge(t0T, ALPHA[p.cementClass]); // B.9
  const bT0 = 1 / (0.1 + t0adj ** 0.2); // B.5
  const bhRaw = 1.5 * (1 + (0.012 * rh) ** 18) * h0;
  const bH = fcm <= 35 ? Math.min(bhRaw + 250, 1500) : Math.min(bhRaw + 250 * a3, 1500 * a3); // B.8a/b
  const bc = ((t - t0) / (bH + t - t0)) ** 0.3; // B.7
  return phiRh * bFcm * bT0 * bc;
}

/** kh of Table 3.3, interpolated. */
function kh(h0: number): number {
  const pts: [number, number][] = [[100, 1.0], [200, 0.85], [300, 0.75], [500, 0.7]];
  if (h0 <= 100) return 1.0;
  if (h0 >= 500) return 0.7;
  for (let k = 0; k < pts.length - 1; k++) {
    const [x0, y0] = pts[k]!;
    const [x1, y1] = pts[k + 1]!;
    if (h0 <= x1) return y0 + ((y1 - y0) * (h0 - x0)) / (x1 - x0);
  }
  return 0.7;
}

/** Nominal unrestrained drying shrinkage εcd,0 (Annex B Eq. B.11), positive = shortening. */
export function en1992DryingBasic(fcm: number, rh: number, cementClass: 'S' | 'N' | 'R'): number {
  const [ads1, ads2] = ADS[cementClass];
  const bRh = 1.55 * (1 - (rh / 100) ** 3);
  return 0.85 * ((220 + 110 * ads1) * Math.exp((-ads2 * fcm) / 10)) * 1e-6 * bRh;
}

/** Total shrinkage εcs = εcd + εca at age t with drying from ts (Eqs. 3.8–3.12), positive = shortening. */
export function en1992Shrinkage(p: En1992Params, t: number, ts: number): number {
  const fck = p.fcm - 8;
  const bds = t > ts ? (t - ts) / (t - ts + 0.04 * Math.sqrt(p.h0 ** 3)) : 0;
  const ecd = bds * kh(p.h0) * en1992DryingBasic(p.fcm, p.rh, p.cementClass);
  const eca = (1 - Math.exp(-0.2 * Math.sqrt(t))) * 2.5 * (fck - 10) * 1e-6;
  return ecd + eca;
}

export function en1992Model(m: ModelInputs): CreepShrinkageModel {
  const p: En1992Params = {
    fcm: m.fcKsi * MPA_PER_KSI + 8,
    h0: 2 * m.volumeToSurfaceIn * MM_PER_IN,
    rh: m.relativeHumidity,
    cementClass: m.cementClass,
  };
  const tf = temperatureAdjustedAge(1, m.curingTemperatureC);
  const adj = (t: number): number => Math.min(t, m.releaseAgeDays) * tf + Math.max(0, t - m.releaseAgeDays);
  const ts = m.releaseAgeDays;
  return {
    // φ refers to 1.05·Ecm; our modulus ratio converts it to the strain at loading (reference §2.3).
    creep: (t, t0) => en1992Creep(p, t, t0, adj(t0)) * m.modulusRatio(t0),
    shrinkage: (t) => en1992Shrinkage(p, t, ts) - en1992Shrinkage(p, ts, ts),
  };
}
