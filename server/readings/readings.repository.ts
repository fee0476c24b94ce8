import type { DataSource, EntityManager } from 'typeorm';
import { isLikelyDistorted, type ReadingDto } from '#shared/api/readings';
import { dateFormat } from '#shared/time/formatters';

// A piece page formats every reading of the piece: the formatter is made once (see shared/time).
const HOUR: Intl.DateTimeFormatOptions = { hour: 'numeric', hourCycle: 'h23' };
const localHour = (d: Date, timeZone: string): number => Number(dateFormat('en-GB', HOUR, timeZone).format(d));

export const READING_SELECT = `
  SELECT r.*, u.name AS taken_by_name, pl.time_zone,
         EXISTS (SELECT 1 FROM reading_photo ph WHERE ph.reading_id = r.id) AS has_photo
    FROM reading r JOIN app_user u ON u.id = r.taken_by JOIN plant pl ON pl.id = r.plant_id`;

export function toReadingDto(r: Record<string, unknown>): ReadingDto {
  const takenAt = new Date(r.taken_at as string);
  const num = (v: unknown): number | null => (v == null ? null : Number(v));
  return {
    id: String(r.id),
    pieceId: String(r.piece_id),
    takenAt: takenAt.toISOString(),
    receivedAt: new Date(r.received_at as string).toISOString(),
    valueMm: Number(r.value_mm),
    enteredText: String(r.entered_text),
    enteredUnit: r.entered_unit as 'in' | 'mm',
    method: String(r.method),
    support: String(r.support),
    overhangMm: num(r.overhang_mm),
    airTempC: num(r.air_temp_c),
    sky: (r.sky as string | null) ?? null,
    note: (r.note as string | null) ?? null,
    takenBy: String(r.taken_by_name),
    supersedes: (r.supersedes as string | null) ?? null,
    supersededBy: (r.superseded_by as string | null) ?? null,
    correctionReason: (r.correction_reason as string | null) ?? null,
    hasPhoto: Boolean(r.has_photo),
    likelyDistorted: isLikelyDistorted(r.sky as string | null, localHour(takenAt, String(r.time_zone))),
  };
}

export async function readingById(db: DataSource | EntityManager, id: string): Promise<ReadingDto | null> {
  const rows: Array<Record<string, unknown>> = await db.query(`${READING_SELECT} WHERE r.id = $1`, [id]);
  return rows[0] ? toReadingDto(rows[0]) : null;
}
