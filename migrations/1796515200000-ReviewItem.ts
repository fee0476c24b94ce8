import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The refresh: drop each piece's row, or write it afresh from its active flags and latest decision (also used by ReviewItemRefresh). */
export const REFRESH = `
        DELETE FROM review_item r WHERE r.piece_id = ANY(ids)
           AND NOT EXISTS (SELECT 1 FROM piece_flag f WHERE f.piece_id = r.piece_id AND f.cleared_at IS NULL);
        INSERT INTO review_item (piece_id, plant_id, job_id, design_id, mark, bay, status, ship_date, max_severity, last_serious_at,
                                 flag_kinds, flags, decision_kind, decided_at, needs_decision)
        SELECT p.id, p.plant_id, p.job_id, p.design_id, p.mark, p.bay, p.status, p.ship_date, fl.max_severity, fl.last_serious_at,
               fl.kinds, fl.flags, ld.kind, ld.decided_at,
               fl.last_serious_at IS NOT NULL AND (ld.decided_at IS NULL OR fl.last_serious_at > ld.decided_at)
          FROM piece p
          JOIN LATERAL (
            SELECT max(f.severity) AS max_severity,
                   max(f.raised_at) FILTER (WHERE f.severity >= 2) AS last_serious_at,
                   array_agg(f.kind ORDER BY f.kind) AS kinds,
                   jsonb_agg(jsonb_build_object('kind', f.kind, 'severity', f.severity, 'reason', f.reason, 'raisedAt', f.raised_at)
                             ORDER BY f.severity DESC, f.raised_at) AS flags
              FROM piece_flag f WHERE f.piece_id = p.id AND f.cleared_at IS NULL
            HAVING count(*) > 0) fl ON true
          LEFT JOIN LATERAL (SELECT x.kind, x.decided_at FROM decision x WHERE x.piece_id = p.id ORDER BY x.decided_at DESC LIMIT 1) ld ON true
         WHERE p.id = ANY(ids)
        ON CONFLICT (piece_id) DO UPDATE SET
          plant_id = EXCLUDED.plant_id, job_id = EXCLUDED.job_id, design_id = EXCLUDED.design_id, mark = EXCLUDED.mark, bay = EXCLUDED.bay,
          status = EXCLUDED.status, ship_date = EXCLUDED.ship_date, max_severity = EXCLUDED.max_severity,
          last_serious_at = EXCLUDED.last_serious_at, flag_kinds = EXCLUDED.flag_kinds, flags = EXCLUDED.flags,
          decision_kind = EXCLUDED.decision_kind, decided_at = EXCLUDED.decided_at, needs_decision = EXCLUDED.needs_decision;
`;

/**
 * One stored row per flagged piece, so the review list reads a page through an index instead of
 * aggregating every active flag and the latest decision of every flagged piece on each request.
 *
 * The row is kept by triggers on the tables it summarises (flags, decisions, the piece itself), in the
 * same transaction as the change, so every writer (projection job, decisions, imports, bay moves,
 * shipping) keeps it right without having to remember to. Statement-level triggers with transition
 * tables refresh each touched piece once per statement, however many rows the statement changed.
 */
export class ReviewItem1796515200000 implements MigrationInterface {
  name = 'ReviewItem1796515200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE review_item (
        piece_id uuid PRIMARY KEY REFERENCES piece(id) ON DELETE CASCADE,
        plant_id uuid NOT NULL REFERENCES plant(id),
        job_id uuid NOT NULL,
        design_id uuid NOT NULL,
        mark text NOT NULL,
        bay text,
        status text NOT NULL,
        ship_date date,
        max_severity integer NOT NULL,
        last_serious_at timestamptz,
        flag_kinds text[] NOT NULL,
        flags jsonb NOT NULL,
        decision_kind text,
        decided_at timestamptz,
        needs_decision boolean NOT NULL
      )`);
    // The default sort (urgency) and the "needs a decision" view, both paged straight off the index.
    await q.query(`CREATE INDEX review_item_urgency_idx ON review_item (plant_id, ship_date ASC NULLS LAST, max_severity DESC, mark) WHERE status <> 'shipped'`);
    await q.query(`CREATE INDEX review_item_decision_idx ON review_item (plant_id, ship_date ASC NULLS LAST, max_severity DESC, mark) WHERE status <> 'shipped' AND needs_decision`);
    await q.query(`
      CREATE FUNCTION review_item_refresh(ids uuid[]) RETURNS void LANGUAGE sql VOLATILE AS $$
        -- Wait for any other writer of these pieces first (in id order, so two refreshes cannot deadlock);
        -- the statements below then take a fresh snapshot and see what that writer committed.
        SELECT 1 FROM piece WHERE id = ANY(ids) ORDER BY id FOR NO KEY UPDATE;
${REFRESH}      $$`);
    // One trigger function per table and event; each reads the transition table it is given.
    const hooks: Array<{ table: string; event: 'INSERT' | 'UPDATE' | 'DELETE'; rows: 'new' | 'old'; key: string }> = [
      { table: 'piece_flag', event: 'INSERT', rows: 'new', key: 'piece_id' },
      { table: 'piece_flag', event: 'UPDATE', rows: 'new', key: 'piece_id' },
      { table: 'piece_flag', event: 'DELETE', rows: 'old', key: 'piece_id' },
      { table: 'decision', event: 'INSERT', rows: 'new', key: 'piece_id' },
      { table: 'decision', event: 'UPDATE', rows: 'new', key: 'piece_id' },
      { table: 'decision', event: 'DELETE', rows: 'old', key: 'piece_id' },
      { table: 'piece', event: 'UPDATE', rows: 'new', key: 'id' },
    ];
    for (const h of hooks) {
      const fn = `review_item_${h.table}_${h.event.toLowerCase()}`;
      // A piece without an active flag has no row: a piece update refreshes only rows that exist.
      const select = h.table === 'piece'
        ? 'SELECT c.id FROM changed c JOIN review_item r ON r.piece_id = c.id'
        : `SELECT DISTINCT ${h.key} FROM changed`;
      await q.query(`
        CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN
          PERFORM review_item_refresh(ARRAY(${select}));
          RETURN NULL;
        END $$`);
      await q.query(`
        CREATE TRIGGER ${fn} AFTER ${h.event} ON ${h.table}
        REFERENCING ${h.rows === 'new' ? 'NEW' : 'OLD'} TABLE AS changed
        FOR EACH STATEMENT EXECUTE FUNCTION ${fn}()`);
    }
    // Rows for the flags that exist already.
    await q.query(`SELECT review_item_refresh(ARRAY(SELECT DISTINCT piece_id FROM piece_flag WHERE cleared_at IS NULL))`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['piece_flag_insert', 'piece_flag_update', 'piece_flag_delete', 'decision_insert', 'decision_update', 'decision_delete', 'piece_update']) {
      const table = t.replace(/_(insert|update|delete)$/, '');
      await q.query(`DROP TRIGGER review_item_${t} ON ${table}`);
      await q.query(`DROP FUNCTION review_item_${t}()`);
    }
    await q.query(`DROP FUNCTION review_item_refresh(uuid[])`);
    await q.query(`DROP TABLE review_item`);
  }
}
