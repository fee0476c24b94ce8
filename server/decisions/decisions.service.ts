import type { z } from 'zod';
import type { SessionUser } from '#shared/api/auth';
import type { decisionInputSchema } from '#shared/api/review';
import { audit } from '../audit/audit.service';
import { rowsOf } from '../db/rows';
import type { Deps } from '../deps';
import { AppError, conflict, forbidden, notFound } from '../http/errors';

type DecisionInput = z.output<typeof decisionInputSchema>;

/** How a decision moves the piece; "re-measure" leaves it where it is. */
const NEXT_STATUS: Record<DecisionInput['kind'], string | null> = { accept: 'in_storage', hold: 'hold', engineering: 'engineering', remeasure: null, clear: 'cleared' };

/**
 * Records a QC decision: append-only, audited, and guarded by the piece's version so two people deciding
 * at once cannot overwrite each other (the second gets 409 with the current state).
 */
export async function decide(d: Deps, user: SessionUser, pieceId: string, input: DecisionInput): Promise<{ id: string; status: string; version: number }> {
  if (input.kind === 'clear' && user.role === 'engineer') throw forbidden('clearing a piece to ship is for QC managers');
  return d.ds.transaction(async (tx) => {
    const rows: Array<{ status: string; version: number }> = await tx.query(`SELECT status, version FROM piece WHERE id = $1 AND plant_id = $2 FOR UPDATE`, [pieceId, user.plantId]);
    const piece = rows[0];
    if (!piece) throw notFound('the piece');
    if (piece.version !== input.version) {
      throw conflict('someone changed this piece meanwhile; look at its current state and decide again', { current: { status: piece.status, version: piece.version } });
    }
    if (piece.status === 'shipped') throw new AppError(409, 'conflict', 'the piece has shipped; decisions are closed');
    if (input.kind === 'clear') {
      const flags: unknown[] = await tx.query(`SELECT 1 FROM piece_flag WHERE piece_id = $1 AND cleared_at IS NULL AND severity >= 2`, [pieceId]);
      if (flags.length && input.comment.length < 5) {
        throw new AppError(400, 'validation_failed', 'clearing a flagged piece needs a comment saying why', { comment: ['say why the flagged piece may ship'] });
      }
    }
    if ((input.kind === 'hold' || input.kind === 'engineering') && input.comment.length < 3) {
      throw new AppError(400, 'validation_failed', 'say what the hold is for', { comment: ['a hold or an engineering review needs a comment'] });
    }
    const [row] = await tx.query(`INSERT INTO decision (plant_id, piece_id, kind, comment, decided_by) VALUES ($1, $2, $3, $4, $5) RETURNING id`, [user.plantId, pieceId, input.kind, input.comment, user.id]);
    const next = NEXT_STATUS[input.kind] ?? piece.status;
    const [updated] = rowsOf<{ version: number }>(await tx.query(`UPDATE piece SET status = $2, version = version + 1, updated_at = now() WHERE id = $1 RETURNING version`, [pieceId, next]));
    await audit(tx, { plantId: user.plantId, userId: user.id, action: `decide-${input.kind}`, entity: 'piece', entityId: pieceId, before: { status: piece.status }, after: { status: next, comment: input.comment } });
    return { id: String(row.id), status: next, version: Number(updated?.version) };
  });
}
