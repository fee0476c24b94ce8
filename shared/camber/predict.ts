import { bandHalfWidth, DEFAULT_BAND, DEFAULT_BAND_Z, DEFAULT_MEASUREMENT_SIGMA_IN, DEFAULT_TOLERANCE_RULES, toleranceFor } from './tolerance';
import { camberAt, PCI_MULTIPLIERS, timelineOf } from './growth';
import { prepareMember, type PreparedMember } from './prepare';
import { CAUTION, predictInputSchema, type CurvePoint, type PredictParsed, type PredictResult } from './schema';
import { serviceCheck } from './service';
import { KN_PER_KIP, MM_PER_IN, MPA_PER_KSI } from './units';

const SOURCES: Record<PredictParsed['method'], string> = {
  multipliers: 'PCI Design Handbook long-time multipliers (Martin, PCI Journal 22(1), 1977), interpolated in time with the ACI 209R-92 creep time ratio',
  aci209: 'ACI 209R-92 creep and shrinkage; AASHTO LRFD 5.9.3.4 losses; age-adjusted effective modulus, χ = 0.7',
  aashto: 'AASHTO LRFD 5.4.2.3 creep and shrinkage; 5.9.3.4 losses; age-adjusted effective modulus, χ = 0.7',
  mc2010: 'fib Model Code 2010 §5.1.9.4 creep and shrinkage; AASHTO LRFD 5.9.3.4 losses; age-adjusted effective modulus, χ = 0.7',
  en1992: 'EN 1992-1-1:2004 Annex B creep, §3.1.4 shrinkage; AASHTO LRFD 5.9.3.4 losses; age-adjusted effective modulus, χ = 0.7',
};

/** Validates the input (throws a ZodError naming the field) and predicts the camber curve. */
export function predict(input: unknown): PredictResult {
  return predictParsed(predictInputSchema.parse(input));
}

export function predictParsed(v: PredictParsed): PredictResult {
  const m = prepareMember(v);
  return predictPrepared(m);
}

export function bandOf(v: PredictParsed): { release: number; growth: number; measurement: number; z: number } {
  const d = DEFAULT_BAND[v.method];
  const meas = v.band?.measurement !== undefined ? (v.units === 'si' ? v.band.measurement / MM_PER_IN : v.band.measurement) : DEFAULT_MEASUREMENT_SIGMA_IN;
  return { release: v.band?.release ?? d.release, growth: v.band?.growth ?? d.growth, measurement: meas, z: v.band?.z ?? DEFAULT_BAND_Z };
}

export function toleranceOf(v: PredictParsed, lengthFt: number): { plusMinus: number; rule: string; source: string } {
  const rule = v.tolerance ?? DEFAULT_TOLERANCE_RULES[v.productType ?? 'double-tee'];
  const source = v.tolerance ? 'given with the input' : DEFAULT_TOLERANCE_RULES[v.productType ?? 'double-tee'].source;
  const capText = rule.capLong !== undefined ? `, ±${rule.capLong} in over ${rule.longOver} ft` : '';
  return { plusMinus: toleranceFor(rule, lengthFt), rule: `±${rule.ratePer10ft} in per 10 ft, at most ±${rule.cap} in${capText}`, source };
}

export function predictPrepared(m: PreparedMember): PredictResult {
  const v = m.input;
  const si = v.units === 'si';
  const k = si ? MM_PER_IN : 1;
  const tl = timelineOf(m);
  const band = bandOf(v);
  const tol = toleranceOf(v, m.lengthFt);
  const points: CurvePoint[] = v.agesDays.map((age) => {
    const s = camberAt(m, tl, age);
    const half = bandHalfWidth(s.elastic, s.growth, band);
    return {
      ageDays: age,
      camber: s.camber * k,
      low: (s.camber - half) * k,
      high: (s.camber + half) * k,
      toleranceLow: (s.camber - tol.plusMinus) * k,
      toleranceHigh: (s.camber + tol.plusMinus) * k,
      creepCoefficient: s.creep,
      prestressLoss: s.loss,
      elastic: s.elastic * k,
      growth: s.growth * k,
    };
  });
  const dSwBed = m.dSw(0);
  const result: PredictResult = {
    units: v.units,
    unitOfCamber: si ? 'mm' : 'in',
    method: v.method,
    section: {
      area: si ? m.section.area * MM_PER_IN ** 2 : m.section.area,
      inertia: si ? m.section.inertia * MM_PER_IN ** 4 : m.section.inertia,
      yb: m.section.yb * k,
      height: m.section.height * k,
      volumeToSurface: m.section.volumeToSurface * k,
      selfWeight: si ? m.selfWeightKipPerIn * KN_PER_KIP * (1000 / MM_PER_IN) : m.selfWeightKipPerIn * 12,
    },
    concrete: { eci: si ? m.eci * MPA_PER_KSI : m.eci, ec28: si ? m.ec28 * MPA_PER_KSI : m.ec28 },
    prestress: {
      jackingForce: m.jackingForce === null ? null : si ? m.jackingForce * KN_PER_KIP : m.jackingForce,
      elasticShorteningLoss: m.esLoss === null ? null : si ? m.esLoss * MPA_PER_KSI : m.esLoss,
      forceAfterRelease: si ? m.forceAfterRelease * KN_PER_KIP : m.forceAfterRelease,
      strandArea: si ? m.strandArea * MM_PER_IN ** 2 : m.strandArea,
    },
    release: { prestress: m.dPs * k, selfWeight: dSwBed * k, net: (m.dPs - dSwBed) * k },
    points,
    tolerance: { ...tol, plusMinus: tol.plusMinus * k },
    band: { ...band, measurement: band.measurement * k, basis: 'judgement from published comparisons of predicted and measured camber; recalibrate on plant readings' },
    sources: [SOURCES[v.method], 'Elastic camber by curvature integration on the end chord (unit-load method)', `Tolerance: ${tol.source}`],
    caution: CAUTION,
  };
  if (v.method === 'multipliers') {
    const f = PCI_MULTIPLIERS;
    result.multipliers = {
      erection: (f.erection.prestress * m.dPs - f.erection.selfWeight * dSwBed) * k,
      final: (f.final.prestress * m.dPs - f.final.selfWeight * dSwBed) * k,
    };
  }
  if (v.service) result.service = serviceCheck(m, v.service, v.service.appliedAtAgeDays);
  return result;
}
