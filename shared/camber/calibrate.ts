// Per-piece calibration: the piece's readings update factors on the elastic and the time-dependent parts
// of its predicted camber, with the product family's factors as the prior. Conjugate Bayesian linear
// regression with known noise (e.g. Gelman et al., Bayesian Data Analysis, 3rd ed., §14.2): with prior
// N(μ0, Λ0⁻¹) and readings y = X·β + ε, ε ~ N(0, σ²), the posterior is N(μ, Λ⁻¹) with
// Λ = Λ0 + XᵀX/σ², μ = Λ⁻¹(Λ0·μ0 + Xᵀy/σ²). The band therefore narrows as readings accrue.

export interface CalibrationReading {
  ageDays: number;
  camber: number;
  /** Taken in conditions that distort it (sun on the top flange in the afternoon). */
  distorted?: boolean;
  /** The curve's parts for this reading when they differ from the curve's (e.g. the piece on the bed). */
  parts?: { elastic: number; growth: number };
}

export interface FactorPrior {
  mean: number;
  sd: number;
}

export interface CalibrationOptions {
  elastic: FactorPrior;
  growth: FactorPrior;
  /** Reading noise, 1σ, in the unit of the curve. */
  measurementSd: number;
  /** Distorted readings: left out, or kept with four times the variance (half the weight in σ). */
  distorted: 'exclude' | 'downweight';
  fitElastic: boolean;
  z: number;
}

export interface FactorEstimate {
  mean: number;
  sd: number;
  low: number;
  high: number;
}

export interface Calibration {
  elastic: FactorEstimate;
  growth: FactorEstimate;
  used: number;
  excludedDistorted: number;
  downweightedDistorted: number;
  note: string;
  /** Calibrated camber and band at an age, from the uncalibrated elastic and growth parts there. */
  at(parts: { elastic: number; growth: number }): { camber: number; low: number; high: number };
}

type Parts = (ageDays: number) => { elastic: number; growth: number };

export function calibrate(partsAt: Parts, readings: CalibrationReading[], o: CalibrationOptions): Calibration {
  const excluded = o.distorted === 'exclude' ? readings.filter((r) => r.distorted).length : 0;
  const used = readings.filter((r) => !(o.distorted === 'exclude' && r.distorted));
  const downweighted = o.distorted === 'downweight' ? used.filter((r) => r.distorted).length : 0;

  // Precision matrix and right-hand side, 2×2 (elastic factor a, growth factor k).
  let l00 = o.fitElastic ? 1 / o.elastic.sd ** 2 : 1e12;
  let l01 = 0;
  let l11 = 1 / o.growth.sd ** 2;
  let r0 = l00 * o.elastic.mean;
  let r1 = l11 * o.growth.mean;
  for (const rd of used) {
    const { elastic, growth } = rd.parts ?? partsAt(rd.ageDays);
    const varI = o.measurementSd ** 2 * (rd.distorted ? 4 : 1);
    l00 += (elastic * elastic) / varI;
    l01 += (elastic * growth) / varI;
    l11 += (growth * growth) / varI;
    r0 += (elastic * rd.camber) / varI;
    r1 += (growth * rd.camber) / varI;
  }
  const det = l00 * l11 - l01 * l01;
  const s00 = l11 / det;
  const s01 = -l01 / det;
  const s11 = l00 / det;
  const a = s00 * r0 + s01 * r1;
  const kk = s01 * r0 + s11 * r1;
  const est = (mean: number, v: number): FactorEstimate => {
    const sd = Math.sqrt(Math.max(0, v));
    return { mean, sd, low: mean - o.z * sd, high: mean + o.z * sd };
  };
  const notes: string[] = [`${used.length} reading${used.length === 1 ? '' : 's'} used`];
  if (excluded) notes.push(`${excluded} taken in sun left out`);
  if (downweighted) notes.push(`${downweighted} taken in sun given less weight`);
  if (used.length === 0) notes.push('no readings yet: the product family prior alone');
  return {
    elastic: est(a, o.fitElastic ? s00 : 0),
    growth: est(kk, s11),
    used: used.length,
    excludedDistorted: excluded,
    downweightedDistorted: downweighted,
    note: notes.join('; '),
    at: ({ elastic, growth }) => {
      const camber = a * elastic + kk * growth;
      const v = elastic * elastic * (o.fitElastic ? s00 : 0) + 2 * elastic * growth * (o.fitElastic ? s01 : 0) + growth * growth * s11 + o.measurementSd ** 2;
      const half = o.z * Math.sqrt(v);
      return { camber, low: camber - half, high: camber + half };
    },
  };
}
