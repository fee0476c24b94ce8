import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The refresh itself, unchanged from migration ReviewItem: drop the piece's row or write it afresh. */
const REFRESH = `
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
 * The review summary's refresh as PL/pgSQL: its plans are kept for the session (a SQL function is planned
 * on every call), and a statement that changed no row returns at once. The projection job syncs flags
 * for a hundred pieces at a time and most syncs change nothing, so this runs several times per batch.
 */
export class ReviewItemRefresh1796860800000 implements MigrationInterface {
  name = 'ReviewItemRefresh1796860800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE OR REPLACE FUNCTION review_item_refresh(ids uuid[]) RETURNS void LANGUAGE plpgsql VOLATILE AS $$
      BEGIN
        IF cardinality(ids) = 0 THEN
          RETURN;
        END IF;
        -- Wait for any other writer of these pieces first (in id order, so two refreshes cannot deadlock);
        -- each statement below takes a fresh snapshot and sees what that writer committed.
        PERFORM 1 FROM piece WHERE id = ANY(ids) ORDER BY id FOR NO KEY UPDATE;
${REFRESH}      END $$`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP FUNCTION review_item_refresh(uuid[])`);
    await q.query(`
      CREATE FUNCTION review_item_refresh(ids uuid[]) RETURNS void LANGUAGE sql VOLATILE AS $$
        SELECT 1 FROM piece WHERE id = ANY(ids) ORDER BY id FOR NO KEY UPDATE;
${REFRESH}      $$`);
  }
}
