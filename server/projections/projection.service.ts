import { createHash } from 'node:crypto';
import { bayMismatches, FLAG_KINDS, projectPiece } from '#shared/projection/project';
import type { Deps } from '../deps';
import { loadPieceForProjection, saveProjection, syncFlags } from './projection.repository';

const PIECE_KINDS = FLAG_KINDS.filter((k) => k !== 'neighbour-mismatch');

export interface RunResult { pieceId: string; plantId: string | null; raised: number }

/**
 * Recomputes one piece: projection, its flags, and the neighbour check of its bay. Idempotent: the same
 * inputs give the same stored row and flags. A failure is recorded for the piece (visible to admins)
 * and rethrown so the queue retries it.
 */
export async function runProjection(d: Deps, pieceId: string, now = new Date()): Promise<RunResult> {
  const piece = await loadPieceForProjection(d.ds, pieceId, now);
  if (!piece) return { pieceId, plantId: null, raised: 0 };
  if (piece.status === 'shipped') {
    await syncFlags(d.ds, piece.plantId, pieceId, [], FLAG_KINDS);
    return { pieceId, plantId: piece.plantId, raised: 0 };
  }
  try {
    const result = projectPiece(piece.input);
    const hash = createHash('sha256').update(JSON.stringify(piece.input)).digest('hex');
    const raised = await d.ds.transaction(async (tx) => {
      await saveProjection(tx, piece, result, hash, now);
      await tx.query(`DELETE FROM projection_failure WHERE piece_id = $1`, [pieceId]);
      return syncFlags(tx, piece.plantId, pieceId, result.flags, PIECE_KINDS);
    });
    const bayRaised = piece.bay ? await checkBay(d, piece.plantId, piece.jobId, piece.bay, piece.input.unit) : 0;
    return { pieceId, plantId: piece.plantId, raised: raised + bayRaised };
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    await d.ds.query(
      `INSERT INTO projection_failure (piece_id, plant_id, message) VALUES ($1, $2, $3)
       ON CONFLICT (piece_id) DO UPDATE SET message = EXCLUDED.message, failed_at = now()`,
      [pieceId, piece.plantId, message.slice(0, 2000)],
    );
    throw e;
  }
}

/** The neighbour check of one erection bay, from the stored projections at erection. */
export async function checkBay(d: Deps, plantId: string, jobId: string, bay: string, unit: 'in' | 'mm'): Promise<number> {
  const rows: Array<{ id: string; mark: string; bay_position: number | null; erection_mm: string | null; differential_mm: string | null }> = await d.ds.query(
    `SELECT p.id, p.mark, p.bay_position, pr.erection_mm, pr.differential_mm
       FROM piece p LEFT JOIN projection pr ON pr.piece_id = p.id
      WHERE p.plant_id = $1 AND p.job_id = $2 AND p.bay = $3 AND p.status <> 'shipped'`,
    [plantId, jobId, bay],
  );
  const diff = Math.min(...rows.map((r) => Number(r.differential_mm ?? Infinity)));
  const mismatches = Number.isFinite(diff)
    ? bayMismatches(rows.map((r) => ({ id: r.id, mark: r.mark, position: r.bay_position, erectionMm: r.erection_mm === null ? null : Number(r.erection_mm) })), diff, unit)
    : new Map<string, string>();
  let raised = 0;
  for (const r of rows) {
    const reason = mismatches.get(r.id);
    raised += await syncFlags(d.ds, plantId, r.id, reason ? [{ kind: 'neighbour-mismatch', severity: 2, reason }] : [], ['neighbour-mismatch']);
  }
  return raised;
}

/** Active pieces that have never been projected (a database from before the projections existed). */
export async function unprojectedPieceIds(d: Deps): Promise<string[]> {
  const rows: Array<{ id: string }> = await d.ds.query(`SELECT p.id FROM piece p LEFT JOIN projection pr ON pr.piece_id = p.id WHERE p.status <> 'shipped' AND pr.piece_id IS NULL`);
  return rows.map((r) => r.id);
}

/** Pieces the nightly run recomputes: every piece not yet shipped. */
export async function activePieceIds(d: Deps, plantId?: string): Promise<string[]> {
  const rows: Array<{ id: string }> = await d.ds.query(
    `SELECT id FROM piece WHERE status <> 'shipped' ${plantId ? 'AND plant_id = $1' : ''} ORDER BY id`,
    plantId ? [plantId] : [],
  );
  return rows.map((r) => r.id);
}

/**
 * Recomputes every active piece in this process (first start after loading the demo, tests). The flags
 * it raises are marked as announced when `quiet`, so a fresh demo does not e-mail its whole history.
 */
export async function recomputeAll(d: Deps, opts: { plantId?: string; quiet?: boolean } = {}): Promise<{ done: number; failed: number }> {
  let done = 0;
  let failed = 0;
  for (const id of await activePieceIds(d, opts.plantId)) {
    try {
      await runProjection(d, id);
      done++;
    } catch {
      failed++; // recorded in projection_failure by runProjection; the rest go on
    }
  }
  if (opts.quiet) await d.ds.query(`UPDATE piece_flag SET notified_at = now() WHERE notified_at IS NULL ${opts.plantId ? 'AND plant_id = $1' : ''}`, opts.plantId ? [opts.plantId] : []);
  return { done, failed };
}
