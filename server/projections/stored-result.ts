// What is stored of a projection result, and its hash. The nightly run compares the hash with the stored
// one and rewrites only results that changed (most pieces on most nights), so the hash is taken over the
// values themselves: the curve's rounded numbers as binary, not its JSON (writing the JSON of every
// curve only to hash it was a fifth of the nightly run's time in this process, measured).
import { createHash } from 'node:crypto';
import type { CurvePointMm, ProjectionResult } from '#shared/projection/project';

const CURVE_FIELDS = ['ageDays', 'camberMm', 'lowMm', 'highMm', 'toleranceLowMm', 'toleranceHighMm', 'calibratedMm', 'calibratedLowMm', 'calibratedHighMm'] as const satisfies ReadonlyArray<keyof CurvePointMm>;
const WIDTH = CURVE_FIELDS.length;

export interface StoredResult {
  /** The projection's columns apart from the curve and from when and which inputs it was computed. */
  columns: Record<string, unknown>;
  /** The curve, rounded: point after point, CURVE_FIELDS in order. */
  curve: Float64Array;
  hash: string;
}

const n = (v: number | null | undefined): number | null => (v === undefined || v === null || !Number.isFinite(v) ? null : v);
/** Curve points are stored to 0.01 mm and 0.01 day: far finer than a tape reads, half the JSON of full doubles. */
const r2 = (v: number): number => Math.round(v * 100) / 100;

export function storedResult(pieceId: string, plantId: string, r: ProjectionResult): StoredResult {
  const columns = {
    piece_id: pieceId, plant_id: plantId, method: r.method, readings_used: r.readingsUsed,
    growth_factor: r.growthFactor, growth_factor_sd: r.growthFactorSd, elastic_factor: r.elasticFactor,
    latest_mm: n(r.latest?.mm), latest_expected_mm: n(r.latest?.expectedMm), latest_low_mm: n(r.latest?.lowMm), latest_high_mm: n(r.latest?.highMm),
    ship_mm: n(r.ship?.mm), ship_low_mm: n(r.ship?.lowMm), ship_high_mm: n(r.ship?.highMm),
    erection_mm: n(r.erection?.mm), erection_low_mm: n(r.erection?.lowMm), erection_high_mm: n(r.erection?.highMm),
    tolerance_mm: r.toleranceMm, differential_mm: r.differentialMm, measured_ratio: n(r.measuredRatio), note: r.note,
  };
  const curve = new Float64Array(r.curve.length * WIDTH);
  let k = 0;
  for (const p of r.curve) { // field by field, in CURVE_FIELDS order (a loop over the names was slower, measured)
    curve[k] = r2(p.ageDays); curve[k + 1] = r2(p.camberMm); curve[k + 2] = r2(p.lowMm); curve[k + 3] = r2(p.highMm);
    curve[k + 4] = r2(p.toleranceLowMm); curve[k + 5] = r2(p.toleranceHighMm);
    curve[k + 6] = r2(p.calibratedMm); curve[k + 7] = r2(p.calibratedLowMm); curve[k + 8] = r2(p.calibratedHighMm);
    k += WIDTH;
  }
  const hash = createHash('sha256').update(JSON.stringify(columns)).update(new Uint8Array(curve.buffer)).digest('hex');
  return { columns, curve, hash };
}

/** The curve as stored (jsonb): one object per point. */
export function curvePoints(curve: Float64Array): CurvePointMm[] {
  const points: CurvePointMm[] = [];
  for (let k = 0; k < curve.length; k += WIDTH) {
    points.push({
      ageDays: curve[k]!, camberMm: curve[k + 1]!, lowMm: curve[k + 2]!, highMm: curve[k + 3]!, toleranceLowMm: curve[k + 4]!, toleranceHighMm: curve[k + 5]!,
      calibratedMm: curve[k + 6]!, calibratedLowMm: curve[k + 7]!, calibratedHighMm: curve[k + 8]!,
    });
  }
  return points;
}
