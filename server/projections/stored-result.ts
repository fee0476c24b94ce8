// What is stored of a projection result, and its hash. The nightly run compares the hash with the stored
// one and rewrites only results that changed (most pieces on most nights). The curve is stored as binary
// (migration ProjectionCurveBinary): each value rounded to 0.01 and written as a 4-byte float, point after
// point, CURVE_FIELDS in order; the hash is taken over those bytes (writing the JSON of every curve only
// to hash it was a fifth of the nightly run's time in this process, measured).
import { createHash } from 'node:crypto';
import type { CurvePointMm, ProjectionResult } from '#shared/projection/project';

const CURVE_FIELDS = ['ageDays', 'camberMm', 'lowMm', 'highMm', 'toleranceLowMm', 'toleranceHighMm', 'calibratedMm', 'calibratedLowMm', 'calibratedHighMm'] as const satisfies ReadonlyArray<keyof CurvePointMm>;
const WIDTH = CURVE_FIELDS.length;

export interface StoredResult {
  /** The projection's columns apart from the curve and from when and which inputs it was computed. */
  columns: Record<string, unknown>;
  /** The curve as stored: point after point, CURVE_FIELDS in order, 4-byte floats, big-endian. */
  curve: Buffer;
  hash: string;
}

const n = (v: number | null | undefined): number | null => (v === undefined || v === null || !Number.isFinite(v) ? null : v);
/**
 * Curve points are stored to 0.01 mm and 0.01 day, far finer than a tape reads. A 4-byte float holds such
 * a value to better than 0.0001 below 1,000 (days or mm), so rounding what it reads back gives the value
 * written.
 */
const r2 = (v: number): number => Math.round(v * 100) / 100;
const BYTES = 4;

export function storedResult(pieceId: string, plantId: string, r: ProjectionResult): StoredResult {
  const columns = {
    piece_id: pieceId, plant_id: plantId, method: r.method, readings_used: r.readingsUsed,
    growth_factor: r.growthFactor, growth_factor_sd: r.growthFactorSd, elastic_factor: r.elasticFactor,
    latest_mm: n(r.latest?.mm), latest_expected_mm: n(r.latest?.expectedMm), latest_low_mm: n(r.latest?.lowMm), latest_high_mm: n(r.latest?.highMm),
    ship_mm: n(r.ship?.mm), ship_low_mm: n(r.ship?.lowMm), ship_high_mm: n(r.ship?.highMm),
    erection_mm: n(r.erection?.mm), erection_low_mm: n(r.erection?.lowMm), erection_high_mm: n(r.erection?.highMm),
    tolerance_mm: r.toleranceMm, differential_mm: r.differentialMm, measured_ratio: n(r.measuredRatio), note: r.note,
  };
  const curve = Buffer.alloc(r.curve.length * WIDTH * BYTES);
  const view = new DataView(curve.buffer, curve.byteOffset, curve.byteLength);
  let k = 0;
  const put = (v: number): void => {
    view.setFloat32(k, r2(v), false); // big-endian, as float4send writes (the migration's conversion)
    k += BYTES;
  };
  for (const p of r.curve) { // field by field, in CURVE_FIELDS order (a loop over the names was slower, measured)
    put(p.ageDays); put(p.camberMm); put(p.lowMm); put(p.highMm); put(p.toleranceLowMm); put(p.toleranceHighMm);
    put(p.calibratedMm); put(p.calibratedLowMm); put(p.calibratedHighMm);
  }
  const hash = createHash('sha256').update(JSON.stringify(columns)).update(curve).digest('hex');
  return { columns, curve, hash };
}

/** A stored curve read back: one point per nine values, each to 0.01 as it was written. */
export function curvePoints(curve: Buffer): CurvePointMm[] {
  const view = new DataView(curve.buffer, curve.byteOffset, curve.byteLength);
  const at = (k: number): number => r2(view.getFloat32(k, false));
  const points: CurvePointMm[] = [];
  for (let k = 0; k + WIDTH * BYTES <= curve.length; k += WIDTH * BYTES) {
    points.push({
      ageDays: at(k), camberMm: at(k + 4), lowMm: at(k + 8), highMm: at(k + 12), toleranceLowMm: at(k + 16), toleranceHighMm: at(k + 20),
      calibratedMm: at(k + 24), calibratedLowMm: at(k + 28), calibratedHighMm: at(k + 32),
    });
  }
  return points;
}
