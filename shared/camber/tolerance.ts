import type { Method, ProductType } from './schema';

/**
 * A tolerance rule as data: ± rate per 10 ft of length, capped; some products have a higher cap past a
 * length. Defaults follow the team's engineering reference §5.1 (PCI MNL-135-00 as remembered: every
 * value is [MEM-M] or [MEM-L] and must be checked against the manual and the project specification).
 */
export interface ToleranceRule {
  ratePer10ft: number; // in per 10 ft
  cap: number; // in
  capLong?: number; // in, for lengths over longOver
  longOver?: number; // ft
  differentialPer10ft: number;
  differentialCap: number;
  source: string;
  confidence: 'MEM-M' | 'MEM-L' | 'plant';
}

const MNL135 = 'PCI MNL-135-00 product tolerances, as remembered (engineering reference §5.1)';

export const DEFAULT_TOLERANCE_RULES: Record<ProductType, ToleranceRule> = {
  'double-tee': { ratePer10ft: 0.25, cap: 0.75, differentialPer10ft: 0.25, differentialCap: 0.75, source: MNL135, confidence: 'MEM-M' },
  'single-tee': { ratePer10ft: 0.25, cap: 0.75, differentialPer10ft: 0.25, differentialCap: 0.75, source: MNL135, confidence: 'MEM-M' },
  'hollow-core': { ratePer10ft: 0.25, cap: 0.75, differentialPer10ft: 0.25, differentialCap: 0.75, source: MNL135, confidence: 'MEM-L' },
  beam: { ratePer10ft: 0.125, cap: 0.75, differentialPer10ft: 0.125, differentialCap: 0.75, source: MNL135, confidence: 'MEM-L' },
  'inverted-tee': { ratePer10ft: 0.125, cap: 0.75, differentialPer10ft: 0.125, differentialCap: 0.75, source: MNL135, confidence: 'MEM-L' },
  'i-girder': { ratePer10ft: 0.125, cap: 0.5, capLong: 1.0, longOver: 80, differentialPer10ft: 0.125, differentialCap: 0.5, source: MNL135, confidence: 'MEM-L' },
  'box-beam': { ratePer10ft: 0.125, cap: 0.5, differentialPer10ft: 0.25, differentialCap: 0.75, source: MNL135, confidence: 'MEM-L' },
  'wall-panel': { ratePer10ft: 0.125, cap: 0.5, differentialPer10ft: 0.125, differentialCap: 0.5, source: MNL135, confidence: 'MEM-L' },
};

/** tol(L) = min(rate·L/10 ft, cap) in inches, L in feet (reference §5.1 rule form). */
export function toleranceFor(rule: Pick<ToleranceRule, 'ratePer10ft' | 'cap' | 'capLong' | 'longOver'>, lengthFt: number): number {
  const cap = rule.capLong !== undefined && rule.longOver !== undefined && lengthFt > rule.longOver ? rule.capLong : rule.cap;
  return Math.min((rule.ratePer10ft * lengthFt) / 10, cap);
}

/** Allowed camber difference between adjacent members of the same design (in), L in feet. */
export function differentialToleranceFor(rule: ToleranceRule, lengthFt: number): number {
  return Math.min((rule.differentialPer10ft * lengthFt) / 10, rule.differentialCap);
}

/**
 * Default expected-band widths (1σ, as a fraction) per method: judgement from the published comparisons
 * in the engineering reference §7 (release camber 1σ ≈ 10 %; storage growth ±25–30 %; an absolute
 * measurement term of 1/8 in). Not sourced values: plants recalibrate them on their own readings.
 */
export const DEFAULT_BAND: Record<Method, { release: number; growth: number }> = {
  multipliers: { release: 0.1, growth: 0.3 },
  aci209: { release: 0.1, growth: 0.3 },
  aashto: { release: 0.1, growth: 0.25 },
  mc2010: { release: 0.1, growth: 0.22 },
  en1992: { release: 0.1, growth: 0.25 },
};
export const DEFAULT_MEASUREMENT_SIGMA_IN = 0.125;
/** Two-sided 90 % normal quantile, so about one reading in ten falls outside the band by chance. */
export const DEFAULT_BAND_Z = 1.6449;

/** Half-width of the expected band: z·√((σe·elastic)² + (σg·growth)² + σm²). */
export function bandHalfWidth(elastic: number, growth: number, b: { release: number; growth: number; measurement: number; z: number }): number {
  return b.z * Math.sqrt((b.release * elastic) ** 2 + (b.growth * growth) ** 2 + b.measurement ** 2);
}
