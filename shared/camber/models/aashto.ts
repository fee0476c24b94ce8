// AASHTO LRFD Bridge Design Specifications, Article 5.4.2.3 (creep 5.4.2.3.2, shrinkage 5.4.2.3.3),
// 2005 interims onward; basis NCHRP Report 496. US customary (ksi, in, days). [MEM-H; ktd forms per
// the engineering reference §3.2]
import type { CreepShrinkageModel, ModelInputs } from './types';

/** Time-development factor ktd: 2005 interims–7th ed. (2014), and 2015 interims / 8th / 9th ed. */
export function aashtoKtd(tDays: number, fciKsi: number, edition: '2005' | '2015'): number {
  if (tDays <= 0) return 0;
  if (edition === '2005') return tDays / (61 - 4 * fciKsi + tDays);
  return tDays / ((12 * (100 - 4 * fciKsi)) / (fciKsi + 20) + tDays);
}

/** Eq. 5.4.2.3.2-2: ks = 1.45 − 0.13·(V/S) ≥ 1.0. */
export const aashtoKs = (vsIn: number): number => Math.max(1.0, 1.45 - 0.13 * vsIn);
/** Eq. 5.4.2.3.2-4: kf = 5/(1 + f'ci). */
export const aashtoKf = (fciKsi: number): number => 5 / (1 + fciKsi);
/** Eq. 5.4.2.3.2-3: khc = 1.56 − 0.008·H. */
export const aashtoKhc = (rh: number): number => 1.56 - 0.008 * rh;
/** Eq. 5.4.2.3.3-2: khs = 2.00 − 0.014·H. */
export const aashtoKhs = (rh: number): number => 2.0 - 0.014 * rh;

/** Eq. 5.4.2.3.2-1: ψ(t, ti) = 1.9·ks·khc·kf·ktd·ti^−0.118. */
export function aashtoCreep(m: ModelInputs, t: number, ti: number): number {
  return 1.9 * aashtoKs(m.volumeToSurfaceIn) * aashtoKhc(m.relativeHumidity) * aashtoKf(m.fciKsi) *
    aashtoKtd(t - ti, m.fciKsi, m.aashtoEdition) * ti ** -0.118;
}

/** Eq. 5.4.2.3.3-1: εsh = ks·khs·kf·ktd·0.48×10⁻³. */
export function aashtoShrinkage(m: ModelInputs, tSinceCuring: number): number {
  return aashtoKs(m.volumeToSurfaceIn) * aashtoKhs(m.relativeHumidity) * aashtoKf(m.fciKsi) *
    aashtoKtd(tSinceCuring, m.fciKsi, m.aashtoEdition) * 0.48e-3;
}

export function aashtoModel(m: ModelInputs): CreepShrinkageModel {
  return {
    creep: (t, t0) => aashtoCreep(m, t, t0),
    shrinkage: (t) => aashtoShrinkage(m, t - m.releaseAgeDays),
  };
}
