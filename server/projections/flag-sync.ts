import type { DataSource, EntityManager } from 'typeorm';
import type { Flag } from '#shared/projection/project';

type Db = DataSource | EntityManager;

export interface WantedFlags {
  plantId: string;
  pieceId: string;
  flags: Flag[];
  /** The kinds decided for this piece; the call's kinds when absent. */
  kinds?: readonly string[];
}

interface ActiveFlag { id: string; piece_id: string; kind: string; severity: number; reason: string }

/**
 * Makes the active flags of some pieces equal to what is wanted, for the kinds decided for each: raises
 * new ones, updates the reason and severity of those still true when they changed, clears the rest.
 * Returns the flags newly raised.
 *
 * The pieces' active flags are read through their index and compared here, and only the differences are
 * written, by flag id. Most syncs change nothing (the nightly run syncs a hundred pieces per batch, night
 * after night), so most write nothing and fire no trigger; matching the wanted list against the table in
 * SQL made the planner scan every active flag of the plant twice per batch (measured: most of the
 * database's time in a nightly batch of a 50,000-piece plant).
 *
 * Another run may sync the same piece at the same time (a reading's projection during the nightly run):
 * a flag raised by both is inserted once (the unique index on active flags), and a flag already cleared
 * is neither cleared nor changed again.
 */
export async function syncFlags(db: Db, wanted: WantedFlags[], kinds: readonly string[]): Promise<Array<{ pieceId: string; plantId: string }>> {
  if (!wanted.length) return [];
  const active: ActiveFlag[] = await db.query(
    `SELECT id, piece_id, kind, severity, reason FROM piece_flag WHERE piece_id = ANY($1::uuid[]) AND cleared_at IS NULL`,
    [wanted.map((w) => w.pieceId)],
  );
  const activeOf = new Map<string, ActiveFlag[]>();
  for (const f of active) activeOf.set(f.piece_id, [...(activeOf.get(f.piece_id) ?? []), f]);

  const clear: string[] = [];
  const change: Array<{ id: string; severity: number; reason: string }> = [];
  const raise: Array<{ plant_id: string; piece_id: string; kind: string; severity: number; reason: string }> = [];
  for (const w of wanted) {
    const have = activeOf.get(w.pieceId) ?? [];
    const decided = w.kinds ?? kinds;
    for (const f of have) {
      if (!decided.includes(f.kind)) continue;
      const want = w.flags.find((x) => x.kind === f.kind);
      if (!want) clear.push(f.id);
      else if (want.severity !== f.severity || want.reason !== f.reason) change.push({ id: f.id, severity: want.severity, reason: want.reason });
    }
    for (const f of w.flags) {
      if (!have.some((x) => x.kind === f.kind)) raise.push({ plant_id: w.plantId, piece_id: w.pieceId, kind: f.kind, severity: f.severity, reason: f.reason });
    }
  }

  if (clear.length) await db.query(`UPDATE piece_flag SET cleared_at = now() WHERE id = ANY($1::uuid[]) AND cleared_at IS NULL`, [clear]);
  if (change.length) {
    await db.query(
      `UPDATE piece_flag f SET severity = x.severity, reason = x.reason
         FROM jsonb_to_recordset($1::jsonb) AS x(id uuid, severity int, reason text) WHERE f.id = x.id AND f.cleared_at IS NULL`,
      [JSON.stringify(change)],
    );
  }
  if (!raise.length) return [];
  const raised: Array<{ piece_id: string; plant_id: string }> = await db.query(
    `INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason)
     SELECT x.plant_id, x.piece_id, x.kind, x.severity, x.reason FROM jsonb_to_recordset($1::jsonb) AS x(plant_id uuid, piece_id uuid, kind text, severity int, reason text)
     ON CONFLICT (piece_id, kind) WHERE cleared_at IS NULL DO NOTHING
     RETURNING piece_id, plant_id`,
    [JSON.stringify(raise)],
  );
  return raised.map((r) => ({ pieceId: r.piece_id, plantId: r.plant_id }));
}
