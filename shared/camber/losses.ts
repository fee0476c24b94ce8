// Prestress losses. US customary: ksi, in², in, kip.
import { EP_KSI, FPY_KSI } from './materials';

/**
 * Elastic shortening loss at transfer, closed form of AASHTO LRFD commentary C5.9.3.2.3a (8th ed.;
 * formerly C5.9.5.2.3a) [MEM-H]:
 * ΔfpES = [Aps·fpbt·(Ig + em²·Ag) − em·Mg·Ag] / [Aps·(Ig + em²·Ag) + Ag·Ig·Eci/Ep]
 */
export function elasticShorteningLoss(p: { aps: number; fpbt: number; ig: number; ag: number; em: number; mg: number; eci: number; ep?: number }): number {
  const ep = p.ep ?? EP_KSI;
  const num = p.aps * p.fpbt * (p.ig + p.em * p.em * p.ag) - p.em * p.mg * p.ag;
  const den = p.aps * (p.ig + p.em * p.em * p.ag) + (p.ag * p.ig * p.eci) / ep;
  return num / den;
}

/** Concrete stress at the strand centroid, fcgp = P/A + P·e²/I − Mg·e/I (ksi), compression positive. */
export const fcgp = (p: number, ag: number, ig: number, e: number, mg: number): number => p / ag + (p * e * e) / ig - (mg * e) / ig;

/** Elastic shortening by iteration on ΔfpES = (Ep/Eci)·fcgp (AASHTO 5.9.3.2.3a), for cross-checks. */
export function elasticShorteningIterated(p: { aps: number; fpbt: number; ig: number; ag: number; em: number; mg: number; eci: number; ep?: number }, firstGuess = 0): number {
  const ep = p.ep ?? EP_KSI;
  let loss = firstGuess;
  for (let k = 0; k < 100; k++) {
    const force = p.aps * (p.fpbt - loss);
    const next = (ep / p.eci) * fcgp(force, p.ag, p.ig, p.em, p.mg);
    if (Math.abs(next - loss) < 1e-9) return next;
    loss = next;
  }
  return loss;
}

/**
 * AASHTO LRFD 5.9.3.4.2 age-adjusted transformed-section factor [MEM-H]:
 * Kid = 1 / [1 + (Ep/Eci)·(Aps/Ag)·(1 + Ag·epg²/Ig)·(1 + 0.7·ψb(tf, ti))]
 */
export function kid(p: { aps: number; ag: number; ig: number; epg: number; eci: number; creepFinal: number; ep?: number }): number {
  const ep = p.ep ?? EP_KSI;
  return 1 / (1 + (ep / p.eci) * (p.aps / p.ag) * (1 + (p.ag * p.epg * p.epg) / p.ig) * (1 + 0.7 * p.creepFinal));
}

/**
 * Intrinsic relaxation of low-relaxation strand since stressing, the time form of pre-2005 AASHTO LRFD
 * 5.9.5.4.4 [MEM-M]: ΔfpR(t) = fpj·[log10(24t)/40]·(fpj/fpy − 0.55), t in days (≥ 1 h).
 */
export function relaxationLoss(fpj: number, daysSinceStressing: number, fpy = FPY_KSI): number {
  const ratio = fpj / fpy - 0.55;
  if (ratio <= 0) return 0;
  const hours = Math.max(1, 24 * daysSinceStressing);
  return fpj * (Math.log10(hours) / 40) * ratio;
}

/** AASHTO LRFD 5.9.3.3 approximate long-term loss: 10·(fpi·Aps/Ag)·γh·γst + 12·γh·γst + ΔfpR [MEM-H]. */
export function approximateLongTermLoss(p: { fpi: number; aps: number; ag: number; rh: number; fciKsi: number; relaxation?: number }): number {
  const gh = 1.7 - 0.01 * p.rh;
  const gst = 5 / (1 + p.fciKsi);
  return 10 * ((p.fpi * p.aps) / p.ag) * gh * gst + 12 * gh * gst + (p.relaxation ?? 2.4);
}
