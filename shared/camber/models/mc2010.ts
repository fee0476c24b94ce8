// fib Model Code 2010 §5.1.9.4 creep (Eqs. 5.1-63 to 5.1-76) and shrinkage (5.1-77 to 5.1-84).
// Formulas [MEM-H], matched line by line against the open-source fib-international/structuralcodes
// implementation (engineering reference §3.3). SI inside: MPa, mm, days, °C.
import { MM_PER_IN, MPA_PER_KSI } from '../units';
import type { CreepShrinkageModel, ModelInputs } from './types';

const CEMENT: Record<'S' | 'N' | 'R', { alpha: number; abs: number; ads1: number; ads2: number }> = {
  S: { alpha: -1, abs: 800, ads1: 3, ads2: 0.013 }, // 32.5N
  N: { alpha: 0, abs: 700, ads1: 4, ads2: 0.012 }, // 32.5R, 42.5N
  R: { alpha: 1, abs: 600, ads1: 6, ads2: 0.012 }, // 42.5R, 52.5N, 52.5R
};

/** Eq. 5.1-85: temperature-adjusted age tT = Δt·exp[13.65 − 4000/(273 + T)]. */
export const temperatureAdjustedAge = (days: number, tempC: number): number => days * Math.exp(13.65 - 4000 / (273 + tempC));

/** Eq. 5.1-73: t0,adj = t0,T·[9/(2 + t0,T^1.2) + 1]^α ≥ 0.5 d. */
export const adjustedLoadingAge = (t0T: number, alpha: number): number => Math.max(0.5, t0T * (9 / (2 + t0T ** 1.2) + 1) ** alpha);

export interface Mc2010Params {
  fcm: number; // MPa
  h: number; // notional size 2Ac/u, mm
  rh: number; // %
  cementClass: 'S' | 'N' | 'R';
}

/** φ(t, t0) relative to Eci at 28 days (Eq. 5.1-63). t0T is the temperature-adjusted loading age. */
export function mc2010Creep(p: Mc2010Params, t: number, t0: number, t0T = t0): number {
  if (t <= t0) return 0;
  const { fcm, h, rh } = p;
  const t0adj = adjustedLoadingAge(t0T, CEMENT[p.cementClass].alpha);
  const bbcFcm = 1.8 / fcm ** 0.7;
  const bbcT = Math.log((30 / t0adj + 0.035) ** 2 * (t - t0) + 1);
  const alphaFcm = Math.sqrt(35 / fcm);
  const bh = Math.min(1.5 * h + 250 * alphaFcm, 1500 * alphaFcm);
  const gamma = 1 / (2.3 + 3.5 / Math.sqrt(t0adj));
  const bdcFcm = 412 / fcm ** 1.4;
  const bRh = (1 - rh / 100) / Math.cbrt((0.1 * h) / 100);
  const bdcT0 = 1 / (0.1 + t0adj ** 0.2);
  const bdcT = ((t - t0) / (bh + (t - t0))) ** gamma;
  return bbcFcm * bbcT + bdcFcm * bRh * bdcT0 * bdcT;
}

/** Total shrinkage εcs(t, ts) (negative = shortening, as in the Model Code). */
export function mc2010Shrinkage(p: Mc2010Params, t: number, ts: number): number {
  const c = CEMENT[p.cementClass];
  const { fcm, h, rh } = p;
  const ecbs0 = -c.abs * ((0.1 * fcm) / (6 + 0.1 * fcm)) ** 2.5 * 1e-6;
  const bbs = 1 - Math.exp(-0.2 * Math.sqrt(t));
  const ecds0 = (220 + 110 * c.ads1) * Math.exp(-c.ads2 * fcm) * 1e-6;
  const bs1 = Math.min(1, (35 / fcm) ** 0.1);
  const bRh = rh >= 99 * bs1 ? 0.25 : -1.55 * (1 - (rh / 100) ** 3);
  const bds = t > ts ? Math.sqrt((t - ts) / (0.035 * h * h + (t - ts))) : 0;
  return ecbs0 * bbs + ecds0 * bRh * bds;
}

export function mc2010Model(m: ModelInputs): CreepShrinkageModel {
  const p: Mc2010Params = {
    fcm: m.fcKsi * MPA_PER_KSI + 8,
    h: 2 * m.volumeToSurfaceIn * MM_PER_IN,
    rh: m.relativeHumidity,
    cementClass: m.cementClass,
  };
  const tempFactor = temperatureAdjustedAge(1, m.curingTemperatureC);
  // Age to temperature-adjusted age: curing at the given temperature up to release, 20 °C after.
  const adj = (t: number): number => Math.min(t, m.releaseAgeDays) * tempFactor + Math.max(0, t - m.releaseAgeDays);
  const ts = m.releaseAgeDays;
  return {
    // Model Code φ refers to Eci(28 d); ×E(t0)/Eci converts to creep per unit elastic strain at loading.
    creep: (t, t0) => mc2010Creep(p, t, t0, adj(t0)) * m.modulusRatio(t0),
    shrinkage: (t) => -(mc2010Shrinkage(p, t, ts) - mc2010Shrinkage(p, ts, ts)),
  };
}
