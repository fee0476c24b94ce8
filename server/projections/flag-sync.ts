import type { DataSource, EntityManager } from 'typeorm';
import type { Flag } from '#shared/projection/project';
import { Statement } from '../db/statement';

type Db = DataSource | EntityManager;

export interface WantedFlags {
  plantId: string;
  pieceId: string;
  flags: Flag[];
  /** The kinds decided for this piece; the call's kinds when absent. */
  kinds?: readonly string[];
}

/** An active flag as read before a sync. */
export interface ActiveFlag { id: string; piece_id: string; kind: string; severity: number; reason: string }

/** What a sync writes: flags to clear and to update (by id), and flags to raise. */
export interface FlagPlan {
  clear: string[];
  change: Array<{ id: string; severity: number; reason: string }>;
  raise: Array<{ plant_id: string; piece_id: string; kind: string; severity: number; reason: string }>;
}

/**
 * Makes the active flags of some pieces equal to what is wanted, for the kinds decided for each: raises
 * new ones, updates the reason and severity of those still true when they changed, clears the rest.
 * Returns the flags newly raised.
 *
 * The pieces' active flags are read through their index and compared here, and only the differences are
 * written, by flag id. Most syncs change nothing (the nightly run syncs 250 pieces per batch, night
 * after night), so most write nothing and fire no trigger; matching the wanted list against the table in
 * SQL made the planner scan every active flag of the plant twice per batch (measured: most of the
 * database's time in a nightly batch of a 50,000-piece plant).
 */
export async function syncFlags(db: Db, wanted: WantedFlags[], kinds: readonly string[]): Promise<Array<{ pieceId: string; plantId: string }>> {
  if (!wanted.length) return [];
  const plan = planFlags(await readActiveFlags(db, wanted.map((w) => w.pieceId)), wanted, kinds);
  const st = new Statement();
  return raisedFrom(await st.run(db, addFlagWrites(st, plan)));
}

export const readActiveFlags = (db: Db, pieceIds: string[]): Promise<ActiveFlag[]> =>
  db.query(`SELECT id, piece_id, kind, severity, reason FROM piece_flag WHERE piece_id = ANY($1::uuid[]) AND cleared_at IS NULL`, [pieceIds]);

/** The differences between the active flags of some pieces and the wanted ones. */
export function planFlags(active: ActiveFlag[], wanted: WantedFlags[], kinds: readonly string[]): FlagPlan {
  const activeOf = new Map<string, ActiveFlag[]>();
  for (const f of active) activeOf.set(f.piece_id, [...(activeOf.get(f.piece_id) ?? []), f]);
  const plan: FlagPlan = { clear: [], change: [], raise: [] };
  for (const w of wanted) {
    const have = activeOf.get(w.pieceId) ?? [];
    const decided = w.kinds ?? kinds;
    for (const f of have) {
      if (!decided.includes(f.kind)) continue;
      const want = w.flags.find((x) => x.kind === f.kind);
      if (!want) plan.clear.push(f.id);
      else if (want.severity !== f.severity || want.reason !== f.reason) plan.change.push({ id: f.id, severity: want.severity, reason: want.reason });
    }
    for (const f of w.flags) {
      if (!have.some((x) => x.kind === f.kind)) plan.raise.push({ plant_id: w.plantId, piece_id: w.pieceId, kind: f.kind, severity: f.severity, reason: f.reason });
    }
  }
  return plan;
}

/**
 * Adds a plan's clearing and updating to a statement, and returns its raising as the statement's final
 * part (rows: the flags raised), or null when nothing is raised.
 *
 * Another run may sync the same piece at the same time (a reading's projection during the nightly run),
 * from flags it read before this one wrote: a flag raised by both is inserted once (the unique index on
 * active flags), and a flag already cleared is neither cleared nor changed again.
 */
export function addFlagWrites(st: Statement, plan: FlagPlan): string | null {
  if (plan.clear.length) st.with(`UPDATE piece_flag SET cleared_at = now() WHERE id = ANY(${st.param(plan.clear)}::uuid[]) AND cleared_at IS NULL RETURNING id`);
  if (plan.change.length) {
    st.with(`UPDATE piece_flag f SET severity = x.severity, reason = x.reason
               FROM jsonb_to_recordset(${st.param(JSON.stringify(plan.change))}::jsonb) AS x(id uuid, severity int, reason text)
              WHERE f.id = x.id AND f.cleared_at IS NULL RETURNING f.id`);
  }
  if (!plan.raise.length) return null;
  return `INSERT INTO piece_flag (plant_id, piece_id, kind, severity, reason)
          SELECT x.plant_id, x.piece_id, x.kind, x.severity, x.reason
            FROM jsonb_to_recordset(${st.param(JSON.stringify(plan.raise))}::jsonb) AS x(plant_id uuid, piece_id uuid, kind text, severity int, reason text)
          ON CONFLICT (piece_id, kind) WHERE cleared_at IS NULL DO NOTHING
          RETURNING piece_id, plant_id`;
}

export const raisedFrom = (rows: Array<{ piece_id: string; plant_id: string }>): Array<{ pieceId: string; plantId: string }> => rows.map((r) => ({ pieceId: r.piece_id, plantId: r.plant_id }));
