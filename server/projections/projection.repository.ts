import type { DataSource, EntityManager } from 'typeorm';
import type { DesignSpec } from '#shared/api/designs';
import type { Flag, ProjectionInput, ProjectionResult } from '#shared/projection/project';
import { dateInZone } from '#shared/yard/schedule';
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
}

/** Everything the projection of one piece needs, read in two queries. */
export async function loadPieceForProjection(db: Db, pieceId: string, now: Date): Promise<PieceForProjection | null> {
  const rows: Array<Record<string, unknown>> = await db.query(
    `SELECT p.id, p.plant_id, p.mark, p.status, p.bay, p.job_id, p.cast_date::text AS cast_date, p.release_date::text AS release_date,
            p.ship_date::text AS ship_date, p.erection_date::text AS erection_date, d.spec, d.product_type, pl.time_zone, pl.unit_system
       FROM piece p JOIN member_design d ON d.id = p.design_id JOIN plant pl ON pl.id = p.plant_id
      WHERE p.id = $1`,
    [pieceId],
  );
  const r = rows[0];
  if (!r) return null;
  const tz = String(r.time_zone);
  const readings: Array<Record<string, unknown>> = await db.query(
    `SELECT id, taken_at, value_mm, support, sky, extract(hour FROM taken_at AT TIME ZONE $2)::int AS local_hour
       FROM reading WHERE piece_id = $1 AND superseded_by IS NULL ORDER BY taken_at`,
    [pieceId, tz],
  );
  // The family's settings override the design where the plant set them (method, humidity, band,
  // tolerance, reading schedule); an adopted growth factor becomes the prior of the calibration.
  const fs = await familySettings(db, String(r.plant_id), String(r.product_type));
  const adopted = await adoptedFactor(db, String(r.plant_id), String(r.product_type));
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
      readings: readings.map((x) => ({
        id: String(x.id),
        takenAt: new Date(x.taken_at as string).toISOString(),
        valueMm: Number(x.value_mm),
        support: String(x.support),
        sky: (x.sky as string | null) ?? null,
        localHour: Number(x.local_hour),
      })),
    },
  };
}

const n = (v: number | null | undefined): number | null => (v === undefined || v === null || !Number.isFinite(v) ? null : v);

/** Replaces the stored projection of a piece (upsert: a repeated run leaves one row). */
export async function saveProjection(db: Db, piece: PieceForProjection, r: ProjectionResult, inputsHash: string, now: Date): Promise<void> {
  await db.query(
    `INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                             latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, ship_mm, ship_low_mm, ship_high_mm,
                             erection_mm, erection_low_mm, erection_high_mm, tolerance_mm, differential_mm, measured_ratio, curve, note)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17, $18, $19, $20, $21, $22, $23, $24)
     ON CONFLICT (piece_id) DO UPDATE SET computed_at = EXCLUDED.computed_at, inputs_hash = EXCLUDED.inputs_hash, method = EXCLUDED.method,
       readings_used = EXCLUDED.readings_used, growth_factor = EXCLUDED.growth_factor, growth_factor_sd = EXCLUDED.growth_factor_sd,
       elastic_factor = EXCLUDED.elastic_factor, latest_mm = EXCLUDED.latest_mm, latest_expected_mm = EXCLUDED.latest_expected_mm,
       latest_low_mm = EXCLUDED.latest_low_mm, latest_high_mm = EXCLUDED.latest_high_mm, ship_mm = EXCLUDED.ship_mm,
       ship_low_mm = EXCLUDED.ship_low_mm, ship_high_mm = EXCLUDED.ship_high_mm, erection_mm = EXCLUDED.erection_mm,
       erection_low_mm = EXCLUDED.erection_low_mm, erection_high_mm = EXCLUDED.erection_high_mm, tolerance_mm = EXCLUDED.tolerance_mm,
       differential_mm = EXCLUDED.differential_mm, measured_ratio = EXCLUDED.measured_ratio, curve = EXCLUDED.curve, note = EXCLUDED.note`,
    [
      piece.id, piece.plantId, now, inputsHash, r.method, r.readingsUsed, r.growthFactor, r.growthFactorSd, r.elasticFactor,
      n(r.latest?.mm), n(r.latest?.expectedMm), n(r.latest?.lowMm), n(r.latest?.highMm), n(r.ship?.mm), n(r.ship?.lowMm), n(r.ship?.highMm),
      n(r.erection?.mm), n(r.erection?.lowMm), n(r.erection?.highMm), r.toleranceMm, r.differentialMm, n(r.measuredRatio), JSON.stringify(r.curve), r.note,
    ],
  );
}

/**
 * Makes the active flags of a piece equal to `flags` for the kinds given: raises new ones, updates the
 * reason of those still true, clears the rest. Returns how many were newly raised.
 */
export async function syncFlags(db: Db, plantId: string, pieceId: string, flags: Flag[], kinds: readonly string[]): Promise<number> {
  const active: Array<{ kind: string }> = await db.query(`SELECT kind FROM piece_flag WHERE piece_id = $1 AND cleared_at IS NULL AND kind = ANY($2::text[])`, [pieceId, kinds]);
  const now = new Set(flags.map((f) => f.kind));
  const toClear = active.map((a) => a.kind).filter((k) => !now.has(k as Flag['kind']));
  if (toClear.length) await db.query(`UPDATE piece_flag SET cleared_at = now() WHERE piece_id = $1 AND cleared_at IS NULL AND kind = ANY($2::text[])`, [pieceId, toClear]);
  let raised = 0;
  for (const f of flags) {
    if (active.some((a) => a.kind === f.kind)) {
      await db.query(`UPDATE piece_flag SET reason = $3, severity = $4 WHERE piece_id = $1 AND kind = $2 AND cleared_at IS NULL`, [pieceId, f.kind, f.reason, f.severity]);
    } else {
      await db.query(`INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason) VALUES ($1, $2, $3, $4, $5)`, [plantId, pieceId, f.kind, f.severity, f.reason]);
      raised++;
    }
  }
  return raised;
}
