import { createHash } from 'node:crypto';
import type { z } from 'zod';
import { parseTape } from '#shared/camber/tape';
import type { SessionUser } from '#shared/api/auth';
import { ERROR_CODES } from '#shared/api/errors';
import type { createReadingSchema, ReadingDto } from '#shared/api/readings';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { AppError, conflict, notFound } from '../http/errors';
import { readingById } from './readings.repository';

type CreateReading = z.output<typeof createReadingSchema>;

/** A stable hash of the request body: key order does not matter, values do. */
function bodyHash(input: CreateReading): string {
  const sorted = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined).sort(([a], [b]) => a.localeCompare(b)));
  return createHash('sha256').update(JSON.stringify(sorted)).digest('hex');
}

export interface CreateResult { reading: ReadingDto; replayed: boolean }

/**
 * Stores a reading once per Idempotency-Key (IETF draft-ietf-httpapi-idempotency-key-header): the same
 * key with the same body returns the stored reading; the same key with another body is refused (422).
 * A correction supersedes the earlier reading; nothing is edited or deleted in place.
 */
export async function createReading(d: Deps, user: SessionUser, key: string, input: CreateReading): Promise<CreateResult> {
  const hash = bodyHash(input);
  const replay = async (): Promise<CreateResult | null> => {
    const rows: Array<{ id: string; request_hash: string }> = await d.ds.query(
      `SELECT id, request_hash FROM reading WHERE plant_id = $1 AND idempotency_key = $2`,
      [user.plantId, key],
    );
    const r = rows[0];
    if (!r) return null;
    if (r.request_hash !== hash) {
      throw new AppError(422, ERROR_CODES.idempotencyMismatch, 'this Idempotency-Key was already used for a different reading');
    }
    return { reading: (await readingById(d.ds, r.id))!, replayed: true };
  };
  const earlier = await replay();
  if (earlier) return earlier;

  const tape = parseTape(input.value, input.unit);
  const id = await d.ds.transaction(async (tx) => {
    const pieces: Array<{ id: string; status: string }> = await tx.query(`SELECT id, status FROM piece WHERE id = $1 AND plant_id = $2`, [input.pieceId, user.plantId]);
    if (!pieces[0]) throw notFound('the piece');
    if (input.supersedes) {
      const old: Array<{ piece_id: string; superseded_by: string | null }> = await tx.query(
        `SELECT piece_id, superseded_by FROM reading WHERE id = $1 AND plant_id = $2 FOR UPDATE`,
        [input.supersedes, user.plantId],
      );
      if (!old[0] || old[0].piece_id !== input.pieceId) throw notFound('the reading to correct');
      if (old[0].superseded_by) throw conflict('that reading was already corrected; correct the newer one');
    }
    const inserted: Array<{ id: string }> = await tx.query(
      `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, overhang_mm,
                            air_temp_c, sky, note, taken_by, idempotency_key, request_hash, supersedes, correction_reason)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17)
       ON CONFLICT (plant_id, idempotency_key) DO NOTHING RETURNING id`,
      [user.plantId, input.pieceId, input.takenAt, tape.mm.toFixed(6), tape.text, tape.unit, input.method, input.support, input.overhangMm ?? null,
        input.airTempC ?? null, input.sky ?? null, input.note ?? null, user.id, key, hash, input.supersedes ?? null, input.correctionReason ?? null],
    );
    const newId = inserted[0]?.id;
    if (!newId) return null; // a concurrent request with the same key won
    if (input.supersedes) await tx.query(`UPDATE reading SET superseded_by = $2 WHERE id = $1`, [input.supersedes, newId]);
    await audit(tx, {
      plantId: user.plantId, userId: user.id, action: input.supersedes ? 'correct' : 'create', entity: 'reading', entityId: newId,
      before: input.supersedes ? { supersedes: input.supersedes } : undefined, after: { pieceId: input.pieceId, valueMm: tape.mm, text: tape.text, takenAt: input.takenAt },
    });
    return newId;
  });
  if (id === null) return (await replay())!;
  await d.jobs?.projectPiece(input.pieceId);
  return { reading: (await readingById(d.ds, id))!, replayed: false };
}
