import type { DataSource, EntityManager } from 'typeorm';
import type { DesignSpec } from '#shared/api/designs';
import type { CurvePointMm, Flag, ProjectionInput, ProjectionResult } from '#shared/projection/project';
import { dateInZone } from '#shared/yard/schedule';
import { isoSql, numSql } from '../db/json-sql';
import { adoptedFactor, familySettings } from '../settings/settings.repository';

type Db = DataSource | EntityManager;

export interface PieceForProjection {
  id: string;
  plantId: string;
  mark: string;
  status: string;
  bay: string | null;
  jobId: string;
  input: ProjectionInput;
  /** The result hash of the projection stored now, if any. */
  storedResultHash: string | null;
}

/** A family's settings and adopted factor, read once per batch however many of its pieces it holds. */
type Family = { fs: Awaited<ReturnType<typeof familySettings>>; adopted: Awaited<ReturnType<typeof adoptedFactor>> };

/**
 * Everything the projections of some pieces need: two queries for the pieces and their readings, and
 * two per product family in the batch. The nightly run loads hundreds of pieces at a time this way.
 */
export async function loadPiecesForProjection(db: Db, ids: string[], now: Date): Promise<PieceForProjection[]> {
  if (!ids.length) return [];
  const rows: Array<Record<string, unknown>> = await db.query(
    `SELECT p.id, p.plant_id, p.mark, p.status, p.bay, p.job_id, p.cast_date::text AS cast_date, p.release_date::text AS release_date,
            p.ship_date::text AS ship_date, p.erection_date::text AS erection_date, p.design_id, d.product_type, pl.time_zone, pl.unit_system,
            pr.result_hash
       FROM piece p JOIN member_design d ON d.id = p.design_id JOIN plant pl ON pl.id = p.plant_id LEFT JOIN projection pr ON pr.piece_id = p.id
      WHERE p.id = ANY($1::uuid[])`,
    [ids],
  );
  // Each piece's live readings as one JSON array, oldest first, with times as ISO text written by
  // PostgreSQL: parsing twenty rows and timestamps a piece in Node was a large part of the nightly load
  // (measured; the nightly run is bound by this process's one core).
  const readings: Array<{ piece_id: string; list: ReadingTuple[] }> = await db.query(
    `SELECT r.piece_id, json_agg(json_build_array(r.id, ${isoSql('r.taken_at')}, ${numSql('r.value_mm')}, r.support, r.sky,
                                                  extract(hour FROM r.taken_at AT TIME ZONE pl.time_zone)::int) ORDER BY r.taken_at) AS list
       FROM reading r JOIN plant pl ON pl.id = r.plant_id
      WHERE r.piece_id = ANY($1::uuid[]) AND r.superseded_by IS NULL
      GROUP BY r.piece_id`,
    [ids],
  );
  // Each design's spec once, not once per piece (a batch holds hundreds of pieces of a few designs).
  const designIds = [...new Set(rows.map((r) => String(r.design_id)))];
  const specs = new Map<string, DesignSpec>(
    (await db.query(`SELECT id, spec FROM member_design WHERE id = ANY($1::uuid[])`, [designIds]) as Array<{ id: string; spec: DesignSpec }>).map((x) => [x.id, x.spec]),
  );
  const readingsOf = new Map(readings.map((x) => [x.piece_id, x.list]));
  const families = new Map<string, Family>();
  const byId = new Map<string, PieceForProjection>();
  for (const r of rows) {
    const key = `${String(r.plant_id)}|${String(r.product_type)}`;
    let family = families.get(key);
    if (!family) {
      family = { fs: await familySettings(db, String(r.plant_id), String(r.product_type)), adopted: await adoptedFactor(db, String(r.plant_id), String(r.product_type)) };
      families.set(key, family);
    }
    byId.set(String(r.id), toPieceForProjection({ ...r, spec: specs.get(String(r.design_id)) }, readingsOf.get(String(r.id)) ?? [], family, now));
  }
  return ids.flatMap((id) => byId.get(id) ?? []);
}

/** A reading as the load query writes it: id, taken at (ISO), value (mm), support, sky, hour on the plant's clock. */
type ReadingTuple = [string, string, number, string, string | null, number];

function toPieceForProjection(r: Record<string, unknown>, readings: ReadingTuple[], { fs, adopted }: Family, now: Date): PieceForProjection {
  const tz = String(r.time_zone);
  // The family's settings override the design where the plant set them (method, humidity, band,
  // tolerance, reading schedule); an adopted growth factor becomes the prior of the calibration.
  const baseSpec = r.spec as DesignSpec;
  const si = baseSpec.units === 'si';
  const spec: DesignSpec = {
    ...baseSpec,
    method: fs.method ?? baseSpec.method,
    environment: { relativeHumidity: fs.relativeHumidity ?? baseSpec.environment?.relativeHumidity ?? 70 },
    band: { release: fs.band.release, growth: fs.band.growth, measurement: si ? fs.band.measurementMm : fs.band.measurementMm / 25.4 },
    tolerance: { ratePer10ft: fs.tolerance.ratePer10ft, cap: fs.tolerance.cap, capLong: fs.tolerance.capLong ?? undefined, longOver: fs.tolerance.longOver ?? undefined },
  };
  return {
    id: String(r.id),
    plantId: String(r.plant_id),
    mark: String(r.mark),
    status: String(r.status),
    bay: (r.bay as string | null) ?? null,
    jobId: String(r.job_id),
    storedResultHash: (r.result_hash as string | null) ?? null,
    input: {
      spec,
      readingAges: fs.readingAges,
      differential: { ratePer10ft: fs.tolerance.differentialPer10ft, cap: fs.tolerance.differentialCap },
      prior: adopted ? { elastic: { mean: 1, sd: fs.band.release }, growth: { mean: adopted.mean, sd: Math.max(adopted.sd, 0.05) } } : undefined,
      productType: String(r.product_type),
      castDate: String(r.cast_date),
      releaseDate: String(r.release_date),
      shipDate: (r.ship_date as string | null) ?? null,
      erectionDate: (r.erection_date as string | null) ?? null,
      today: dateInZone(now, tz),
      unit: r.unit_system === 'si' ? 'mm' : 'in',
      readings: readings.map(([id, takenAt, valueMm, support, sky, localHour]) => ({ id, takenAt, valueMm, support, sky, localHour })),
    },
  };
}

const n = (v: number | null | undefined): number | null => (v === undefined || v === null || !Number.isFinite(v) ? null : v);

/**
 * Curve points are stored to 0.01 mm and 0.01 day: far finer than a tape reads, half the JSON of full
 * doubles. Field by field: the nightly run rounds millions of values (a generic copy was a third of the
 * engine's own time, measured).
 */
const r2 = (v: number): number => Math.round(v * 100) / 100;
const roundPoint = (p: CurvePointMm): CurvePointMm => ({
  ageDays: r2(p.ageDays), camberMm: r2(p.camberMm), lowMm: r2(p.lowMm), highMm: r2(p.highMm),
  toleranceLowMm: r2(p.toleranceLowMm), toleranceHighMm: r2(p.toleranceHighMm),
  calibratedMm: r2(p.calibratedMm), calibratedLowMm: r2(p.calibratedLowMm), calibratedHighMm: r2(p.calibratedHighMm),
});

export interface Projected { piece: PieceForProjection; result: ProjectionResult; inputsHash: string }

/** The stored columns of a projection, apart from when and from which inputs it was computed. */
export function projectionRow({ piece, result: r }: Projected): Record<string, unknown> {
  return {
    piece_id: piece.id, plant_id: piece.plantId, method: r.method, readings_used: r.readingsUsed,
    growth_factor: r.growthFactor, growth_factor_sd: r.growthFactorSd, elastic_factor: r.elasticFactor,
    latest_mm: n(r.latest?.mm), latest_expected_mm: n(r.latest?.expectedMm), latest_low_mm: n(r.latest?.lowMm), latest_high_mm: n(r.latest?.highMm),
    ship_mm: n(r.ship?.mm), ship_low_mm: n(r.ship?.lowMm), ship_high_mm: n(r.ship?.highMm),
    erection_mm: n(r.erection?.mm), erection_low_mm: n(r.erection?.lowMm), erection_high_mm: n(r.erection?.highMm),
    tolerance_mm: r.toleranceMm, differential_mm: r.differentialMm, measured_ratio: n(r.measuredRatio), curve: r.curve.map(roundPoint), note: r.note,
  };
}

/** Replaces the stored projections of some pieces in one statement (upsert: a repeated run leaves one row each). */
export async function saveProjections(db: Db, items: Array<{ row: Record<string, unknown>; inputsHash: string; resultHash: string }>, now: Date): Promise<void> {
  if (!items.length) return;
  const rows = items.map((x) => ({ ...x.row, inputs_hash: x.inputsHash, result_hash: x.resultHash }));
  await db.query(
    `INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, result_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                             latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, ship_mm, ship_low_mm, ship_high_mm,
                             erection_mm, erection_low_mm, erection_high_mm, tolerance_mm, differential_mm, measured_ratio, curve, note)
     SELECT x.piece_id, x.plant_id, $2, x.inputs_hash, x.result_hash, x.method, x.readings_used, x.growth_factor, x.growth_factor_sd, x.elastic_factor,
            x.latest_mm, x.latest_expected_mm, x.latest_low_mm, x.latest_high_mm, x.ship_mm, x.ship_low_mm, x.ship_high_mm,
            x.erection_mm, x.erection_low_mm, x.erection_high_mm, x.tolerance_mm, x.differential_mm, x.measured_ratio, x.curve, x.note
       FROM jsonb_to_recordset($1::jsonb) AS x(piece_id uuid, plant_id uuid, inputs_hash text, result_hash text, method text, readings_used int, growth_factor numeric,
            growth_factor_sd numeric, elastic_factor numeric, latest_mm numeric, latest_expected_mm numeric, latest_low_mm numeric, latest_high_mm numeric,
            ship_mm numeric, ship_low_mm numeric, ship_high_mm numeric, erection_mm numeric, erection_low_mm numeric, erection_high_mm numeric,
            tolerance_mm numeric, differential_mm numeric, measured_ratio numeric, curve jsonb, note text)
     ON CONFLICT (piece_id) DO UPDATE SET computed_at = EXCLUDED.computed_at, inputs_hash = EXCLUDED.inputs_hash, result_hash = EXCLUDED.result_hash,
       method = EXCLUDED.method, readings_used = EXCLUDED.readings_used, growth_factor = EXCLUDED.growth_factor, growth_factor_sd = EXCLUDED.growth_factor_sd,
       elastic_factor = EXCLUDED.elastic_factor, latest_mm = EXCLUDED.latest_mm, latest_expected_mm = EXCLUDED.latest_expected_mm,
       latest_low_mm = EXCLUDED.latest_low_mm, latest_high_mm = EXCLUDED.latest_high_mm, ship_mm = EXCLUDED.ship_mm,
       ship_low_mm = EXCLUDED.ship_low_mm, ship_high_mm = EXCLUDED.ship_high_mm, erection_mm = EXCLUDED.erection_mm,
       erection_low_mm = EXCLUDED.erection_low_mm, erection_high_mm = EXCLUDED.erection_high_mm, tolerance_mm = EXCLUDED.tolerance_mm,
       differential_mm = EXCLUDED.differential_mm, measured_ratio = EXCLUDED.measured_ratio, curve = EXCLUDED.curve, note = EXCLUDED.note`,
    [JSON.stringify(rows), now],
  );
}

/** Marks stored projections whose result did not change as computed now from these inputs (the curve is not rewritten). */
export async function touchProjections(db: Db, items: Array<{ pieceId: string; inputsHash: string }>, now: Date): Promise<void> {
  if (!items.length) return;
  await db.query(
    `UPDATE projection p SET computed_at = $2, inputs_hash = x.inputs_hash
       FROM jsonb_to_recordset($1::jsonb) AS x(piece_id uuid, inputs_hash text) WHERE p.piece_id = x.piece_id`,
    [JSON.stringify(items.map((i) => ({ piece_id: i.pieceId, inputs_hash: i.inputsHash }))), now],
  );
}

export interface WantedFlags {
  plantId: string;
  pieceId: string;
  flags: Flag[];
  /** The kinds decided for this piece; the call's kinds when absent. */
  kinds?: readonly string[];
}

/**
 * Makes the active flags of some pieces equal to what is wanted, for the kinds decided for each: raises
 * new ones, updates the reason and severity of those still true when they changed, clears the rest. One
 * statement whatever the number of pieces (the nightly run syncs a hundred pieces per batch, and most
 * syncs change nothing). Returns the flags newly raised.
 */
export async function syncFlags(db: Db, wanted: WantedFlags[], kinds: readonly string[]): Promise<Array<{ pieceId: string; plantId: string }>> {
  if (!wanted.length) return [];
  const want = JSON.stringify(wanted.flatMap((w) => w.flags.map((f) => ({ plant_id: w.plantId, piece_id: w.pieceId, kind: f.kind, severity: f.severity, reason: f.reason }))));
  const scope = JSON.stringify(wanted.map((w) => ({ piece_id: w.pieceId, kinds: w.kinds ?? kinds })));
  // The two updates touch different rows (kinds not wanted, kinds wanted) and the insert only kinds
  // without an active flag, so the three parts of the statement never meet on a row. The id array
  // lets the clearing read the pieces' flags through the index (joined to the list alone, the planner
  // scanned every flag of the plant).
  const raised: Array<{ piece_id: string; plant_id: string }> = await db.query(
    `WITH w AS (SELECT * FROM jsonb_to_recordset($1::jsonb) AS w(plant_id uuid, piece_id uuid, kind text, severity int, reason text)),
          s AS (SELECT * FROM jsonb_to_recordset($2::jsonb) AS s(piece_id uuid, kinds text[])),
          cleared AS (
            UPDATE piece_flag f SET cleared_at = now() FROM s
             WHERE f.piece_id = ANY($3::uuid[]) AND f.piece_id = s.piece_id AND f.cleared_at IS NULL AND f.kind = ANY(s.kinds)
               AND NOT EXISTS (SELECT 1 FROM w WHERE w.piece_id = f.piece_id AND w.kind = f.kind)
            RETURNING f.id),
          changed AS (
            UPDATE piece_flag f SET reason = w.reason, severity = w.severity FROM w
             WHERE f.piece_id = w.piece_id AND f.kind = w.kind AND f.cleared_at IS NULL
               AND (f.reason, f.severity) IS DISTINCT FROM (w.reason, w.severity)
            RETURNING f.id)
     INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason)
     SELECT w.plant_id, w.piece_id, w.kind, w.severity, w.reason FROM w
      WHERE NOT EXISTS (SELECT 1 FROM piece_flag f WHERE f.piece_id = w.piece_id AND f.kind = w.kind AND f.cleared_at IS NULL)
     ON CONFLICT (piece_id, kind) WHERE cleared_at IS NULL DO NOTHING
     RETURNING piece_id, plant_id`,
    [want, scope, wanted.map((w) => w.pieceId)],
  );
  return raised.map((r) => ({ pieceId: r.piece_id, plantId: r.plant_id }));
}
