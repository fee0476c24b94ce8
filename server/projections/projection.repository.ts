import { createHash } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { DesignSpec } from '#shared/api/designs';
import type { FamilySettings } from '#shared/api/settings';
import type { ProjectionInput, ProjectionResult } from '#shared/projection/project';
import { dateInZone } from '#shared/yard/schedule';
import { isoSql, numSql } from '../db/json-sql';
import { familiesForProjection, type FamilyForProjection } from '../settings/settings.repository';
import type { Statement } from '../db/statement';
import type { ActiveFlag } from './flag-sync';
import type { StoredResult } from './stored-result';

type Db = DataSource | EntityManager;

export interface PieceForProjection {
  id: string;
  plantId: string;
  mark: string;
  status: string;
  bay: string | null;
  jobId: string;
  unit: 'in' | 'mm';
  /**
   * The engine's input, made when asked for: made for each piece just before it is projected, the
   * inputs of a whole batch do not outlive the young generation of the heap (garbage collection was the
   * largest cost of a batch after the engine, measured).
   */
  input(): ProjectionInput;
  /** Its active flags when loaded (what a sync compares the wanted ones with). */
  activeFlags: ActiveFlag[];
  /** Whether its last projection run failed (projection_failure). */
  hadFailure: boolean;
  /** Fingerprint of the engine's input (stored with the result: which inputs it was computed from). */
  inputsHash: string;
  /** The projection stored now, if any: its result hash. */
  stored: { resultHash: string | null } | null;
}

/**
 * Everything the projections of some pieces need, in three queries whatever their number: the pieces
 * with their readings, their designs and their families' settings. The nightly run loads 250 pieces at
 * a time this way.
 *
 * Each piece's live readings come as one JSON array, oldest first, with times as ISO text written by
 * PostgreSQL (parsing twenty rows and timestamps a piece in Node was a large part of the nightly load,
 * measured), kept as text: it is hashed as it is. They are read piece by piece from the covering index
 * reading_piece_live_idx without touching the table: a plant's readings arrive day by day, so a piece's
 * twenty lie on twenty pages, and reading those pages was the largest database cost of a night
 * (migration ReadingLiveIndex).
 */
export async function loadPiecesForProjection(db: Db, ids: string[], now: Date): Promise<PieceForProjection[]> {
  if (!ids.length) return [];
  const rows: PieceRow[] = await db.query(
    `SELECT p.id, p.plant_id, p.mark, p.status, p.bay, p.job_id, p.cast_date::text AS cast_date, p.release_date::text AS release_date,
            p.ship_date::text AS ship_date, p.erection_date::text AS erection_date, p.design_id, d.product_type, pl.time_zone, pl.unit_system,
            pr.piece_id IS NOT NULL AS has_projection, pr.result_hash,
            (SELECT json_agg(json_build_object('id', f.id, 'kind', f.kind, 'severity', f.severity, 'reason', f.reason))
               FROM piece_flag f WHERE f.piece_id = p.id AND f.cleared_at IS NULL) AS flags,
            EXISTS (SELECT 1 FROM projection_failure x WHERE x.piece_id = p.id) AS had_failure,
            (SELECT json_agg(json_build_array(r.id, ${isoSql('r.taken_at')}, ${numSql('r.value_mm')}, r.support, r.sky,
                                              extract(hour FROM r.taken_at AT TIME ZONE pl.time_zone)::int) ORDER BY r.taken_at)
               FROM reading r WHERE r.piece_id = p.id AND r.superseded_by IS NULL)::text AS readings
       FROM piece p JOIN member_design d ON d.id = p.design_id JOIN plant pl ON pl.id = p.plant_id LEFT JOIN projection pr ON pr.piece_id = p.id
      WHERE p.id = ANY($1::uuid[])`,
    [ids],
  );
  // Each design and each family once, not once per piece (a batch holds 250 pieces of a few of each).
  const designIds = [...new Set(rows.map((r) => r.design_id))];
  const designs = new Map<string, DesignSpec>(
    (await db.query(`SELECT id, spec FROM member_design WHERE id = ANY($1::uuid[])`, [designIds]) as Array<{ id: string; spec: DesignSpec }>).map((x) => [x.id, x.spec]),
  );
  const familyKeys = new Map(rows.map((r) => [`${r.plant_id}|${r.product_type}`, { plantId: r.plant_id, productType: r.product_type }]));
  const families = await familiesForProjection(db, [...familyKeys.values()]);
  const specs = new Map<string, { spec: DesignSpec; json: string }>(); // per design and family
  const todayIn = new Map<string, string>(); // the plant's date, once per time zone
  const byId = new Map<string, PieceForProjection>();
  for (const r of rows) {
    const familyKey = `${r.plant_id}|${r.product_type}`;
    const family = families.get(familyKey)!;
    const specKey = `${r.design_id}|${familyKey}`;
    if (!specs.has(specKey)) {
      const spec = specWithSettings(designs.get(r.design_id)!, family.settings);
      specs.set(specKey, { spec, json: JSON.stringify(spec) });
    }
    if (!todayIn.has(r.time_zone)) todayIn.set(r.time_zone, dateInZone(now, r.time_zone));
    byId.set(r.id, toPieceForProjection(r, r.readings ?? '[]', specs.get(specKey)!, family, todayIn.get(r.time_zone)!));
  }
  return ids.flatMap((id) => byId.get(id) ?? []);
}

interface PieceRow {
  id: string; plant_id: string; mark: string; status: string; bay: string | null; job_id: string; cast_date: string; release_date: string;
  ship_date: string | null; erection_date: string | null; design_id: string; product_type: string; time_zone: string; unit_system: string;
  has_projection: boolean; result_hash: string | null;
  flags: Array<Omit<ActiveFlag, 'piece_id'>> | null; had_failure: boolean; readings: string | null;
}

/** A reading as the load query writes it: id, taken at (ISO), value (mm), support, sky, hour on the plant's clock. */
type ReadingTuple = [string, string, number, string, string | null, number];

/**
 * The family's settings override the design where the plant set them (method, humidity, band,
 * tolerance, reading schedule).
 */
function specWithSettings(baseSpec: DesignSpec, fs: FamilySettings): DesignSpec {
  const si = baseSpec.units === 'si';
  return {
    ...baseSpec,
    method: fs.method ?? baseSpec.method,
    environment: { relativeHumidity: fs.relativeHumidity ?? baseSpec.environment?.relativeHumidity ?? 70 },
    band: { release: fs.band.release, growth: fs.band.growth, measurement: si ? fs.band.measurementMm : fs.band.measurementMm / 25.4 },
    tolerance: { ratePer10ft: fs.tolerance.ratePer10ft, cap: fs.tolerance.cap, capLong: fs.tolerance.capLong ?? undefined, longOver: fs.tolerance.longOver ?? undefined },
  };
}

function toPieceForProjection(r: PieceRow, readingsText: string, spec: { spec: DesignSpec; json: string }, { settings: fs, adopted }: FamilyForProjection, today: string): PieceForProjection {
  // An adopted growth factor becomes the prior of the calibration.
  const rest = {
    readingAges: fs.readingAges,
    differential: { ratePer10ft: fs.tolerance.differentialPer10ft, cap: fs.tolerance.differentialCap },
    prior: adopted ? { elastic: { mean: 1, sd: fs.band.release }, growth: { mean: adopted.mean, sd: Math.max(adopted.sd, 0.05) } } : undefined,
    productType: r.product_type,
    castDate: r.cast_date,
    releaseDate: r.release_date,
    shipDate: r.ship_date,
    erectionDate: r.erection_date,
    today,
    unit: r.unit_system === 'si' ? ('mm' as const) : ('in' as const),
  };
  const readings = (): ProjectionInput['readings'] => (JSON.parse(readingsText) as ReadingTuple[]).map(([id, takenAt, valueMm, support, sky, localHour]) => ({ id, takenAt, valueMm, support, sky, localHour }));
  return {
    id: r.id,
    plantId: r.plant_id,
    mark: r.mark,
    status: r.status,
    bay: r.bay,
    jobId: r.job_id,
    activeFlags: (r.flags ?? []).map((f) => ({ ...f, piece_id: r.id })),
    hadFailure: r.had_failure,
    stored: r.has_projection ? { resultHash: r.result_hash } : null,
    unit: rest.unit,
    input: () => ({ spec: spec.spec, ...rest, readings: readings() }),
    // Of everything the engine is given, from the texts it is built from: the spec's JSON once per design
    // and family, the readings as PostgreSQL wrote them (the JSON of the whole input, made again for each
    // piece only to be hashed, cost more than a tenth of the engine's time, measured).
    inputsHash: createHash('sha256').update(spec.json).update('\n').update(JSON.stringify(rest)).update('\n').update(readingsText).digest('hex'),
  };
}

/** A piece projected in a batch: what the batch still needs of it once its result is stored. */
export interface Projected { piece: PieceForProjection; flags: ProjectionResult['flags'] }

/**
 * Adds to a statement the storing of a batch's results: changed ones replaced whole (upsert: a repeated
 * run leaves one row each), unchanged ones only marked as computed now from these inputs (the curve is
 * not rewritten), and the pieces' earlier failures forgotten.
 */
export function addProjectionWrites(st: Statement, b: { changed: Array<{ stored: StoredResult; inputsHash: string }>; unchanged: Array<{ pieceId: string; inputsHash: string }>; unfailed: string[] }, now: Date): void {
  const at = b.changed.length || b.unchanged.length ? st.param(now) : '';
  if (b.changed.length) {
    const rows = b.changed.map(({ stored, inputsHash }) => ({ ...stored.columns, curve: stored.curve.toString('base64'), inputs_hash: inputsHash, result_hash: stored.hash }));
    st.with(`INSERT INTO projection (piece_id, plant_id, computed_at, inputs_hash, result_hash, method, readings_used, growth_factor, growth_factor_sd, elastic_factor,
                             latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, ship_mm, ship_low_mm, ship_high_mm,
                             erection_mm, erection_low_mm, erection_high_mm, tolerance_mm, differential_mm, measured_ratio, curve, note)
     SELECT x.piece_id, x.plant_id, ${at}, x.inputs_hash, x.result_hash, x.method, x.readings_used, x.growth_factor, x.growth_factor_sd, x.elastic_factor,
            x.latest_mm, x.latest_expected_mm, x.latest_low_mm, x.latest_high_mm, x.ship_mm, x.ship_low_mm, x.ship_high_mm,
            x.erection_mm, x.erection_low_mm, x.erection_high_mm, x.tolerance_mm, x.differential_mm, x.measured_ratio, decode(x.curve, 'base64'), x.note
       FROM jsonb_to_recordset(${st.param(JSON.stringify(rows))}::jsonb) AS x(piece_id uuid, plant_id uuid, inputs_hash text, result_hash text, method text, readings_used int, growth_factor numeric,
            growth_factor_sd numeric, elastic_factor numeric, latest_mm numeric, latest_expected_mm numeric, latest_low_mm numeric, latest_high_mm numeric,
            ship_mm numeric, ship_low_mm numeric, ship_high_mm numeric, erection_mm numeric, erection_low_mm numeric, erection_high_mm numeric,
            tolerance_mm numeric, differential_mm numeric, measured_ratio numeric, curve text, note text)
     ON CONFLICT (piece_id) DO UPDATE SET computed_at = EXCLUDED.computed_at, inputs_hash = EXCLUDED.inputs_hash, result_hash = EXCLUDED.result_hash,
       method = EXCLUDED.method, readings_used = EXCLUDED.readings_used, growth_factor = EXCLUDED.growth_factor, growth_factor_sd = EXCLUDED.growth_factor_sd,
       elastic_factor = EXCLUDED.elastic_factor, latest_mm = EXCLUDED.latest_mm, latest_expected_mm = EXCLUDED.latest_expected_mm,
       latest_low_mm = EXCLUDED.latest_low_mm, latest_high_mm = EXCLUDED.latest_high_mm, ship_mm = EXCLUDED.ship_mm,
       ship_low_mm = EXCLUDED.ship_low_mm, ship_high_mm = EXCLUDED.ship_high_mm, erection_mm = EXCLUDED.erection_mm,
       erection_low_mm = EXCLUDED.erection_low_mm, erection_high_mm = EXCLUDED.erection_high_mm, tolerance_mm = EXCLUDED.tolerance_mm,
       differential_mm = EXCLUDED.differential_mm, measured_ratio = EXCLUDED.measured_ratio, curve = EXCLUDED.curve, note = EXCLUDED.note
     RETURNING piece_id`);
  }
  if (b.unchanged.length) {
    st.with(`UPDATE projection p SET computed_at = ${at}, inputs_hash = x.inputs_hash
               FROM jsonb_to_recordset(${st.param(JSON.stringify(b.unchanged.map((i) => ({ piece_id: i.pieceId, inputs_hash: i.inputsHash }))))}::jsonb) AS x(piece_id uuid, inputs_hash text)
              WHERE p.piece_id = x.piece_id RETURNING p.piece_id`);
  }
  if (b.unfailed.length) st.with(`DELETE FROM projection_failure WHERE piece_id = ANY(${st.param(b.unfailed)}::uuid[]) RETURNING piece_id`);
}
