import type { DataSource, EntityManager } from 'typeorm';
import { SUN_DISTORTION, type ReadingDto } from '#shared/api/readings';
import { isoSql, numSql } from '../db/json-sql';

/**
 * A reading as the API describes it (`readingSchema`), built in SQL over `r` (reading), `u` (its
 * inspector) and `pl` (its plant): the reading lookup and the piece page share it. "Likely distorted"
 * is the shared rule `isLikelyDistorted` on the hour of the plant's clock when the reading was taken.
 */
export const READING_JSON = `json_build_object(
    'id', r.id, 'pieceId', r.piece_id, 'takenAt', ${isoSql('r.taken_at')}, 'receivedAt', ${isoSql('r.received_at')},
    'valueMm', ${numSql('r.value_mm')}, 'enteredText', r.entered_text, 'enteredUnit', r.entered_unit, 'method', r.method, 'support', r.support,
    'overhangMm', ${numSql('r.overhang_mm')}, 'airTempC', ${numSql('r.air_temp_c')}, 'sky', r.sky, 'note', r.note, 'takenBy', u.name,
    'supersedes', r.supersedes, 'supersededBy', r.superseded_by, 'correctionReason', r.correction_reason,
    'hasPhoto', EXISTS (SELECT 1 FROM reading_photo ph WHERE ph.reading_id = r.id),
    'likelyDistorted', coalesce(r.sky = '${SUN_DISTORTION.sky}'
      AND extract(hour FROM r.taken_at AT TIME ZONE pl.time_zone) >= ${SUN_DISTORTION.fromHour}
      AND extract(hour FROM r.taken_at AT TIME ZONE pl.time_zone) < ${SUN_DISTORTION.toHour}, false))`;

export const READING_FROM = 'reading r JOIN app_user u ON u.id = r.taken_by JOIN plant pl ON pl.id = r.plant_id';

export async function readingById(db: DataSource | EntityManager, id: string): Promise<ReadingDto | null> {
  const rows: Array<{ doc: ReadingDto }> = await db.query(`SELECT ${READING_JSON} AS doc FROM ${READING_FROM} WHERE r.id = $1`, [id]);
  return rows[0]?.doc ?? null;
}
