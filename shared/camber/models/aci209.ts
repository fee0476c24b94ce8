// ACI 209R-92, "Prediction of Creep, Shrinkage, and Temperature Effects in Concrete Structures",
// Chapter 2 (Eqs. 2-8 to 2-22 and the correction factors of §2.5). Values [MEM-H] per the team's
// engineering reference §3.1.
import type { CreepShrinkageModel, ModelInputs } from './types';

/** Eq. 2-8 time ratio for creep, ψ = 0.60, d = 10. */
export const aci209CreepRatio = (tDays: number): number => (tDays <= 0 ? 0 : tDays ** 0.6 / (10 + tDays ** 0.6));
/** Eqs. 2-9/2-10 time ratio for shrinkage: f = 35 moist cured, 55 steam cured. */
export const aci209ShrinkageRatio = (tDays: number, curing: 'steam' | 'moist'): number =>
  tDays <= 0 ? 0 : tDays / ((curing === 'moist' ? 35 : 55) + tDays);
/** Eqs. 2-11/2-12 loading-age factor γla. */
export const aci209LoadingAge = (tla: number, curing: 'steam' | 'moist'): number =>
  curing === 'moist' ? 1.25 * tla ** -0.118 : 1.13 * tla ** -0.094;

/** γcp for initial moist curing (§2.5.3), interpolated in the table; steam curing 1–3 d → 1.0. */
function moistCuringFactor(days: number): number {
  const table: [number, number][] = [[1, 1.2], [3, 1.1], [7, 1.0], [14, 0.93], [28, 0.86], [60, 0.79], [90, 0.75]];
  if (days <= 1) return 1.2;
  if (days >= 90) return 0.75;
  for (let k = 0; k < table.length - 1; k++) {
    const [d0, f0] = table[k]!;
    const [d1, f1] = table[k + 1]!;
    if (days <= d1) return f0 + ((f1 - f0) * (days - d0)) / (d1 - d0);
  }
  return 0.75;
}

/** Ultimate creep coefficient νu = 2.35·γc (Eq. 2-13 with the factors of §2.5). */
export function aci209UltimateCreep(m: ModelInputs, loadAge: number): number {
  const rh = m.relativeHumidity;
  const vs = m.volumeToSurfaceIn;
  const s = m.slumpIn ?? 2.7;
  const psi = m.finesPercent ?? 50;
  const air = m.airPercent ?? 6;
  const gLa = aci209LoadingAge(loadAge, m.curing);
  const gRh = rh > 40 ? 1.27 - 0.0067 * rh : 1.0;
  const gVs = (2 / 3) * (1 + 1.13 * Math.exp(-0.54 * vs));
  const gS = 0.82 + 0.067 * s;
  const gPsi = 0.88 + 0.0024 * psi;
  const gAir = Math.max(1.0, 0.46 + 0.09 * air);
  return 2.35 * gLa * gRh * gVs * gS * gPsi * gAir;
}

/** Ultimate shrinkage εshu = 780×10⁻⁶·γsh (Eq. 2-14 with the factors of §2.5). */
export function aci209UltimateShrinkage(m: ModelInputs): number {
  const rh = Math.max(40, m.relativeHumidity);
  const vs = m.volumeToSurfaceIn;
  const s = m.slumpIn ?? 2.7;
  const psi = m.finesPercent ?? 50;
  const air = m.airPercent ?? 6;
  const c = m.cementLbPerYd3 ?? 700;
  const gCp = m.curing === 'steam' ? 1.0 : moistCuringFactor(m.releaseAgeDays);
  const gRh = rh <= 80 ? 1.4 - 0.0102 * rh : 3.0 - 0.03 * rh;
  const gVs = 1.2 * Math.exp(-0.12 * vs);
  const gS = 0.89 + 0.041 * s;
  const gPsi = psi <= 50 ? 0.3 + 0.014 * psi : 0.9 + 0.002 * psi;
  const gC = 0.75 + 0.00036 * c;
  const gAir = 0.95 + 0.008 * air;
  return 780e-6 * gCp * gRh * gVs * gS * gPsi * gC * gAir;
}

export function aci209Model(m: ModelInputs): CreepShrinkageModel {
  const epsU = aci209UltimateShrinkage(m);
  return {
    creep: (t, t0) => aci209UltimateCreep(m, t0) * aci209CreepRatio(t - t0),
    shrinkage: (t) => epsU * aci209ShrinkageRatio(t - m.releaseAgeDays, m.curing),
  };
}
