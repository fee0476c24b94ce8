import { bayMismatches, FLAG_KINDS, projectPiece } from '#shared/projection/project';
import type { Deps } from '../deps';
import { Statement } from '../db/statement';
import { addFlagWrites, planFlags, raisedFrom, syncFlags, type WantedFlags } from './flag-sync';
import { addProjectionWrites, loadPiecesForProjection, type Projected } from './projection.repository';
import { type StoredResult, storedResult } from './stored-result';

const PIECE_KINDS = FLAG_KINDS.filter((k) => k !== 'neighbour-mismatch');
/** Pieces per call when everything is recomputed in this process. */
const RECOMPUTE_BATCH = 200;

export interface RunResult { pieceId: string; plantId: string | null; raised: number }
/**
 * Which bays a batch checks: those of all its pieces (a reading, an edit), or none (a batch of the nightly
 * run: every bay is checked once after the night's last batch, `checkAllBays`, from the night's results).
 */
export type BayCheck = 'all' | 'none';

export interface BatchResult { projected: number; raised: Array<{ pieceId: string; plantId: string }>; failed: Array<{ pieceId: string; error: unknown }> }

/**
 * Recomputes some pieces: projections, their flags, and the neighbour check of their bays, with a
 * fixed number of statements per batch (the nightly run does hundreds of pieces per call). Idempotent:
 * the same inputs give the same stored rows and flags. A piece the engine refuses is recorded in
 * projection_failure (visible to admins) and returned in `failed`; the others are stored regardless.
 */
export async function runProjectionBatch(d: Deps, ids: string[], now = new Date(), opts: { bays: BayCheck } = { bays: 'all' }): Promise<BatchResult> {
  if (!ids.length) return { projected: 0, raised: [], failed: [] };
  const pieces = await loadPiecesForProjection(d.ds, ids, now);
  const projected: Projected[] = [];
  // A result equal to the stored one (most pieces on most nights) is only marked as computed now.
  const changed: Array<{ stored: StoredResult; inputsHash: string }> = [];
  const unchanged: Array<{ pieceId: string; inputsHash: string }> = [];
  const failed: BatchResult['failed'] = [];
  for (const piece of pieces) {
    if (piece.status === 'shipped') continue;
    try {
      // Of the result only its stored form and its flags are kept, so the rest dies young.
      const result = projectPiece(piece.input());
      const stored = storedResult(piece.id, piece.plantId, result);
      const item: Projected = { piece, flags: result.flags };
      projected.push(item);
      if (stored.hash === piece.stored?.resultHash) unchanged.push({ pieceId: piece.id, inputsHash: piece.inputsHash });
      else changed.push({ stored, inputsHash: piece.inputsHash });
    } catch (error) {
      failed.push({ pieceId: piece.id, error });
    }
  }
  // One statement stores the results, forgets the pieces' earlier failures and syncs their flags with
  // those read when they were loaded. A shipped piece keeps no flag; a piece in no bay has no neighbours
  // to mismatch (it may have just left one); the neighbour flag of a piece in a bay is the bay check's
  // to decide.
  const shipped: WantedFlags[] = pieces.filter((p) => p.status === 'shipped').map((p) => ({ plantId: p.plantId, pieceId: p.id, flags: [] }));
  const pieceFlags = projected.map((x) => ({ plantId: x.piece.plantId, pieceId: x.piece.id, flags: x.flags, kinds: x.piece.bay ? PIECE_KINDS : FLAG_KINDS }));
  const st = new Statement();
  addProjectionWrites(st, { changed, unchanged, unfailed: projected.filter((x) => x.piece.hadFailure).map((x) => x.piece.id) }, now);
  const plan = planFlags(pieces.flatMap((p) => p.activeFlags), [...shipped, ...pieceFlags], FLAG_KINDS);
  const raised = raisedFrom(await st.run(d.ds, addFlagWrites(st, plan)));
  if (failed.length) {
    const plantOf = new Map(pieces.map((p) => [p.id, p.plantId]));
    await d.ds.query(
      `INSERT INTO projection_failure (piece_id, plant_id, message)
       SELECT x.piece_id, x.plant_id, x.message FROM jsonb_to_recordset($1::jsonb) AS x(piece_id uuid, plant_id uuid, message text)
       ON CONFLICT (piece_id) DO UPDATE SET message = EXCLUDED.message, failed_at = now()`,
      [JSON.stringify(failed.map((f) => ({ piece_id: f.pieceId, plant_id: plantOf.get(f.pieceId), message: (f.error instanceof Error ? f.error.message : String(f.error)).slice(0, 2000) })))],
    );
  }
  // After an edit or a reading the bays of all the pieces are checked (a piece may have moved). The
  // nightly run checks no bay in its batches: checked batch by batch, a bay would be checked again with
  // each batch holding one of its members, half of them projected for the night and half not, raising
  // and clearing flags that the night's results do not bear out (measured on a first night: each bay
  // checked about eight times, a quarter of the database's time).
  const bays = new Map<string, Bay>();
  if (opts.bays === 'all') for (const { piece } of projected) if (piece.bay) bays.set(`${piece.plantId}|${piece.jobId}|${piece.bay}`, { plantId: piece.plantId, jobId: piece.jobId, bay: piece.bay, unit: piece.unit });
  const bayRaised = await checkBays(d, [...bays.values()]);
  return { projected: projected.length, raised: [...raised, ...bayRaised], failed };
}

/** Recomputes one piece (a reading, an edit). Throws when the engine refuses it, so the queue retries. */
export async function runProjection(d: Deps, pieceId: string, now = new Date()): Promise<RunResult> {
  const r = await runProjectionBatch(d, [pieceId], now);
  if (r.failed[0]) throw r.failed[0].error;
  const plantId = r.raised[0]?.plantId ?? (await d.ds.query(`SELECT plant_id FROM piece WHERE id = $1`, [pieceId]))[0]?.plant_id ?? null;
  return { pieceId, plantId, raised: r.raised.length };
}

interface Bay { plantId: string; jobId: string; bay: string; unit: 'in' | 'mm' }

/** The neighbour check of erection bays, from the stored projections at erection: one read, one sync. */
export async function checkBays(d: Deps, bays: Bay[]): Promise<Array<{ pieceId: string; plantId: string }>> {
  if (!bays.length) return [];
  const rows: Array<{ id: string; plant_id: string; job_id: string; bay: string; mark: string; bay_position: number | null; erection_mm: string | null; differential_mm: string | null }> = await d.ds.query(
    `SELECT p.id, p.plant_id, p.job_id, p.bay, p.mark, p.bay_position, pr.erection_mm, pr.differential_mm
       FROM piece p LEFT JOIN projection pr ON pr.piece_id = p.id
       JOIN unnest($1::uuid[], $2::uuid[], $3::text[]) AS b(plant_id, job_id, bay) ON b.plant_id = p.plant_id AND b.job_id = p.job_id AND b.bay = p.bay
      WHERE p.status <> 'shipped'`,
    [bays.map((b) => b.plantId), bays.map((b) => b.jobId), bays.map((b) => b.bay)],
  );
  const byBay = new Map<string, typeof rows>();
  for (const r of rows) {
    const key = `${r.plant_id}|${r.job_id}|${r.bay}`;
    byBay.set(key, [...(byBay.get(key) ?? []), r]);
  }
  const wanted: WantedFlags[] = [];
  for (const b of bays) {
    const members = byBay.get(`${b.plantId}|${b.jobId}|${b.bay}`) ?? [];
    const diff = Math.min(...members.map((r) => Number(r.differential_mm ?? Infinity)));
    const mismatches = Number.isFinite(diff)
      ? bayMismatches(members.map((r) => ({ id: r.id, mark: r.mark, position: r.bay_position, erectionMm: r.erection_mm === null ? null : Number(r.erection_mm) })), diff, b.unit)
      : new Map<string, string>();
    for (const r of members) {
      const reason = mismatches.get(r.id);
      wanted.push({ plantId: b.plantId, pieceId: r.id, flags: reason ? [{ kind: 'neighbour-mismatch', severity: 2, reason }] : [] });
    }
  }
  return syncFlags(d.ds, wanted, ['neighbour-mismatch']);
}

/** The neighbour check of every bay with pieces in storage (the nightly run: membership may have changed). */
export async function checkAllBays(d: Deps, plantId?: string): Promise<Array<{ pieceId: string; plantId: string }>> {
  const bays: Array<{ plant_id: string; job_id: string; bay: string; unit_system: string }> = await d.ds.query(
    `SELECT DISTINCT p.plant_id, p.job_id, p.bay, pl.unit_system FROM piece p JOIN plant pl ON pl.id = p.plant_id
      WHERE p.bay IS NOT NULL AND p.status <> 'shipped' ${plantId ? 'AND p.plant_id = $1' : ''}`,
    plantId ? [plantId] : [],
  );
  return checkBays(d, bays.map((b) => ({ plantId: b.plant_id, jobId: b.job_id, bay: b.bay, unit: b.unit_system === 'si' ? 'mm' : 'in' })));
}

/** The neighbour check of one erection bay (after a bay plan is saved). Returns how many flags it raised. */
export async function checkBay(d: Deps, plantId: string, jobId: string, bay: string, unit: 'in' | 'mm'): Promise<number> {
  return (await checkBays(d, [{ plantId, jobId, bay, unit }])).length;
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
  const ids = await activePieceIds(d, opts.plantId);
  for (let i = 0; i < ids.length; i += RECOMPUTE_BATCH) {
    const r = await runProjectionBatch(d, ids.slice(i, i + RECOMPUTE_BATCH));
    done += r.projected;
    failed += r.failed.length; // recorded in projection_failure; the rest go on
  }
  if (opts.quiet) await d.ds.query(`UPDATE piece_flag SET notified_at = now() WHERE notified_at IS NULL ${opts.plantId ? 'AND plant_id = $1' : ''}`, opts.plantId ? [opts.plantId] : []);
  return { done, failed };
}
