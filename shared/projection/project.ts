// The projection of one piece: its predicted curve, calibrated by its own readings with the product
// family as the prior, projected to the planned ship and erection dates, and the flags a QC manager
// acts on. Pure: the projection job feeds it from the database and stores what it returns.
import { calibrate, type FactorPrior } from '../camber/calibrate';
import { memberCurve } from '../camber/curve';
import { predictInputSchema } from '../camber/schema';
import { formatLength } from '../camber/tape';
import { differentialToleranceFor, DEFAULT_TOLERANCE_RULES } from '../camber/tolerance';
import { MM_PER_IN } from '../camber/units';
import type { DesignSpec } from '../api/designs';
import { isLikelyDistorted } from '../api/readings';
import { readingDue } from '../yard/schedule';

export const FLAG_KINDS = ['outside-tolerance', 'outside-band', 'heading-outside', 'neighbour-mismatch', 'reading-overdue', 'reading-in-doubt'] as const;
export type FlagKind = (typeof FLAG_KINDS)[number];
export const FLAG_LABELS: Record<FlagKind, string> = {
  'outside-tolerance': 'Outside tolerance now',
  'outside-band': 'Outside the expected band now',
  'heading-outside': 'Heading outside tolerance by ship date',
  'neighbour-mismatch': 'Mismatch with neighbours in the bay',
  'reading-overdue': 'Reading overdue',
  'reading-in-doubt': 'Reading in doubt',
};
export interface Flag { kind: FlagKind; severity: number; reason: string }

export interface ProjectionReading {
  id: string;
  takenAt: string;
  valueMm: number;
  support: string;
  sky: string | null;
  /** Hour of day in the plant's time zone, for the sun check. */
  localHour: number;
}

export interface ProjectionInput {
  spec: DesignSpec;
  productType: string;
  castDate: string;
  releaseDate: string;
  shipDate: string | null;
  erectionDate: string | null;
  readings: ProjectionReading[];
  /** The plant's today (YYYY-MM-DD) and its reading schedule. */
  today: string;
  readingAges?: number[];
  prior?: { elastic: FactorPrior; growth: FactorPrior };
  /** Differential tolerance rule between neighbours (in per 10 ft, cap in); the product type's default otherwise. */
  differential?: { ratePer10ft: number; cap: number };
  unit: 'in' | 'mm';
}

export interface ProjectedPoint { mm: number; lowMm: number; highMm: number; toleranceLowMm: number; toleranceHighMm: number; ageDays: number }

export interface CurvePointMm {
  ageDays: number;
  camberMm: number;
  lowMm: number;
  highMm: number;
  toleranceLowMm: number;
  toleranceHighMm: number;
  calibratedMm: number;
  calibratedLowMm: number;
  calibratedHighMm: number;
}

export interface ProjectionResult {
  method: string;
  readingsUsed: number;
  elasticFactor: number;
  growthFactor: number;
  growthFactorSd: number;
  latest: { readingId: string; mm: number; expectedMm: number; lowMm: number; highMm: number; ageDays: number } | null;
  ship: ProjectedPoint | null;
  erection: ProjectedPoint | null;
  toleranceMm: number;
  differentialMm: number;
  measuredRatio: number | null;
  curve: CurvePointMm[];
  flags: Flag[];
  note: string;
}

const DAY = 86_400_000;
const ageOf = (castDate: string, iso: string): number => (Date.parse(iso) - Date.parse(`${castDate}T00:00:00Z`)) / DAY;
const dateAge = (castDate: string, date: string): number => (Date.parse(`${date}T12:00:00Z`) - Date.parse(`${castDate}T00:00:00Z`)) / DAY;

/**
 * Ages for the stored curve: daily for two weeks after release, then weekly up to the first week at or
 * past `lastAge`. The curve ends on that fixed grid rather than at `lastAge` itself, which moves with
 * today: a piece's stored result then changes about once a week instead of every night.
 */
function curveAges(releaseAge: number, lastAge: number): number[] {
  const ages: number[] = [];
  for (let a = releaseAge; a <= Math.min(lastAge, releaseAge + 14); a += 1) ages.push(a);
  if (lastAge > releaseAge + 14) for (let a = releaseAge + 21; ; a += 7) {
    ages.push(a);
    if (a >= lastAge) break;
  }
  if (ages.at(-1)! < lastAge) ages.push(lastAge);
  return ages;
}

/** A jump between readings that creep does not explain: more than 1/4 in, or 3·√2 measurement σ (judgement). */
const JUMP_LIMIT_MM = (measurementSdMm: number): number => Math.max(6.35, 3 * Math.SQRT2 * measurementSdMm);

export function projectPiece(p: ProjectionInput): ProjectionResult {
  const parsed = predictInputSchema.parse({ ...p.spec, agesDays: [1] });
  const curve = memberCurve(parsed);
  const toMm = (v: number): number => v * MM_PER_IN; // the curve works in inches whatever the input units
  const fmt = (mm: number): string => formatLength(mm, p.unit);
  const band = curve.band;
  const prior = p.prior ?? { elastic: { mean: 1, sd: band.release }, growth: { mean: 1, sd: band.growth } };

  const readings = [...p.readings].sort((a, b) => a.takenAt.localeCompare(b.takenAt));
  const withAge = readings.map((r) => ({ ...r, ageDays: Math.max(curve.releaseAge, ageOf(p.castDate, r.takenAt)), distorted: isLikelyDistorted(r.sky, r.localHour) }));
  const partsAt = (age: number, support?: string): { elastic: number; growth: number } => {
    const s = curve.at(age, support === 'bed' ? 'bed' : undefined);
    return { elastic: s.elastic, growth: s.growth };
  };
  const cal = calibrate(
    (age) => partsAt(age),
    withAge.map((r) => ({ ageDays: r.ageDays, camber: r.valueMm / MM_PER_IN, distorted: r.distorted, parts: partsAt(r.ageDays, r.support) })),
    { elastic: prior.elastic, growth: prior.growth, measurementSd: band.measurement, distorted: 'exclude', fitElastic: true, z: band.z },
  );
  const priorOnly = calibrate(partsAt, [], { elastic: prior.elastic, growth: prior.growth, measurementSd: band.measurement, distorted: 'exclude', fitElastic: true, z: band.z });

  const project = (date: string | null): ProjectedPoint | null => {
    if (!date) return null;
    const age = Math.max(curve.releaseAge, dateAge(p.castDate, date));
    const s = curve.at(age);
    const c = cal.at(s);
    return { ageDays: age, mm: toMm(c.camber), lowMm: toMm(c.low), highMm: toMm(c.high), toleranceLowMm: toMm(s.toleranceLow), toleranceHighMm: toMm(s.toleranceHigh) };
  };
  const ship = project(p.shipDate);
  const erection = project(p.erectionDate);

  const todayAge = dateAge(p.castDate, p.today);
  const lastAge = Math.min(730, Math.max(todayAge, ship?.ageDays ?? 0, erection?.ageDays ?? 0) + 30);
  const points: CurvePointMm[] = curveAges(curve.releaseAge, Math.max(lastAge, curve.releaseAge + 1)).map((age) => {
    const s = curve.at(age);
    const c = cal.at(s);
    return {
      ageDays: Math.round(age * 100) / 100,
      camberMm: toMm(s.camber),
      lowMm: toMm(s.low),
      highMm: toMm(s.high),
      toleranceLowMm: toMm(s.toleranceLow),
      toleranceHighMm: toMm(s.toleranceHigh),
      calibratedMm: toMm(c.camber),
      calibratedLowMm: toMm(c.low),
      calibratedHighMm: toMm(c.high),
    };
  });

  // Flags
  const flags: Flag[] = [];
  const trustworthy = withAge.filter((r) => !r.distorted);
  const last = trustworthy.at(-1);
  let latest: ProjectionResult['latest'] = null;
  let measuredRatio: number | null = null;
  if (last) {
    const s = curve.at(last.ageDays, last.support === 'bed' ? 'bed' : undefined);
    const pr = priorOnly.at(s);
    latest = { readingId: last.id, mm: last.valueMm, expectedMm: toMm(pr.camber), lowMm: toMm(pr.low), highMm: toMm(pr.high), ageDays: last.ageDays };
    measuredRatio = s.camber !== 0 ? last.valueMm / toMm(s.camber) : null;
    const when = last.takenAt.slice(0, 10);
    const age = Math.floor(last.ageDays);
    if (last.valueMm > toMm(s.toleranceHigh) || last.valueMm < toMm(s.toleranceLow)) {
      const above = last.valueMm > toMm(s.toleranceHigh);
      flags.push({ kind: 'outside-tolerance', severity: 3, reason: `The reading of ${when} (${fmt(last.valueMm)}, age ${age} d) is ${above ? 'above' : 'below'} the tolerance limit of ${fmt(toMm(above ? s.toleranceHigh : s.toleranceLow))} (predicted ${fmt(toMm(s.camber))}).` });
    } else if (last.valueMm > latest.highMm || last.valueMm < latest.lowMm) {
      flags.push({ kind: 'outside-band', severity: 2, reason: `The reading of ${when} (${fmt(last.valueMm)}, age ${age} d) is outside the expected band ${fmt(latest.lowMm)} to ${fmt(latest.highMm)}.` });
    }
  }
  const target = [ship && p.shipDate ? { at: ship, label: `ship date ${p.shipDate}` } : null, erection && p.erectionDate ? { at: erection, label: `erection date ${p.erectionDate}` } : null].find(
    (x) => x && (x.at.mm > x.at.toleranceHighMm || x.at.mm < x.at.toleranceLowMm),
  );
  if (target && !flags.some((f) => f.kind === 'outside-tolerance')) {
    const high = target.at.mm > target.at.toleranceHighMm;
    flags.push({
      kind: 'heading-outside',
      severity: 2,
      reason: `Projected ${fmt(target.at.mm)} (${fmt(target.at.lowMm)} to ${fmt(target.at.highMm)}) at the ${target.label}, ${high ? 'above' : 'below'} the tolerance limit of ${fmt(high ? target.at.toleranceHighMm : target.at.toleranceLowMm)}.`,
    });
  }
  const due = readingDue({ castDate: p.castDate, releaseDate: p.releaseDate, lastReadingDate: readings.at(-1)?.takenAt.slice(0, 10) ?? null, today: p.today, ages: p.readingAges });
  if (due.overdue) flags.push({ kind: 'reading-overdue', severity: 1, reason: `The reading due on ${due.dueSince} has not been taken.` });
  const newest = withAge.at(-1);
  if (newest?.distorted) {
    flags.push({ kind: 'reading-in-doubt', severity: 1, reason: `The latest reading (${newest.takenAt.slice(0, 10)}) was taken in afternoon sun; measure again early in the day or in shade.` });
  } else if (trustworthy.length >= 2) {
    const [a, b] = trustworthy.slice(-2) as [(typeof trustworthy)[number], (typeof trustworthy)[number]];
    const predictedChange = toMm(curve.at(b.ageDays).camber - curve.at(a.ageDays).camber);
    const change = b.valueMm - a.valueMm;
    if (Math.abs(change - predictedChange) > JUMP_LIMIT_MM(band.measurement * MM_PER_IN)) {
      flags.push({ kind: 'reading-in-doubt', severity: 1, reason: `Camber changed ${change >= 0 ? '+' : '−'}${fmt(Math.abs(change))} between ${a.takenAt.slice(0, 10)} and ${b.takenAt.slice(0, 10)}; creep explains ${predictedChange >= 0 ? '+' : '−'}${fmt(Math.abs(predictedChange))}.` });
    }
  }
  const base = DEFAULT_TOLERANCE_RULES[(p.productType as keyof typeof DEFAULT_TOLERANCE_RULES) ?? 'double-tee'] ?? DEFAULT_TOLERANCE_RULES['double-tee'];
  const rule = p.differential ? { ...base, differentialPer10ft: p.differential.ratePer10ft, differentialCap: p.differential.cap } : base;
  return {
    method: parsed.method,
    readingsUsed: cal.used,
    elasticFactor: cal.elastic.mean,
    growthFactor: cal.growth.mean,
    growthFactorSd: cal.growth.sd,
    latest,
    ship,
    erection,
    toleranceMm: toMm(curve.tolerance),
    differentialMm: differentialToleranceFor(rule, curve.lengthFt) * MM_PER_IN,
    measuredRatio,
    curve: points,
    flags,
    note: cal.note,
  };
}

/**
 * Bay check: adjacent positions whose projected cambers at erection differ by more than the
 * differential tolerance (engineering reference §5.3; tolerance per product type, [MEM-M/L]). Of each
 * such pair, the piece further from the bay's median is flagged: it is the one to hold back or swap.
 */
export function bayMismatches(pieces: Array<{ id: string; mark: string; position: number | null; erectionMm: number | null }>, differentialMm: number, unit: 'in' | 'mm'): Map<string, string> {
  const placed = pieces.filter((p) => p.position !== null && p.erectionMm !== null).sort((a, b) => a.position! - b.position!);
  const values = placed.map((p) => p.erectionMm!).sort((a, b) => a - b);
  const median = values.length ? (values[Math.floor((values.length - 1) / 2)]! + values[Math.ceil((values.length - 1) / 2)]!) / 2 : 0;
  const out = new Map<string, string>();
  for (let i = 1; i < placed.length; i++) {
    const a = placed[i - 1]!;
    const b = placed[i]!;
    const diff = Math.abs(a.erectionMm! - b.erectionMm!);
    if (diff <= differentialMm) continue;
    const odd = Math.abs(a.erectionMm! - median) >= Math.abs(b.erectionMm! - median) ? a : b;
    const other = odd === a ? b : a;
    const text = `Projected at erection ${formatLength(odd.erectionMm!, unit)}, ${formatLength(diff, unit)} from its neighbour ${other.mark} (${formatLength(other.erectionMm!, unit)}); at most ${formatLength(differentialMm, unit)} is allowed between neighbours.`;
    out.set(odd.id, out.has(odd.id) ? `${out.get(odd.id)} ${text}` : text);
  }
  return out;
}
