import type { MigrationInterface, QueryRunner } from 'typeorm';
import { refreshWithIsoTimes } from './1797033600000-ReviewItemFlagTimes';
import { refreshFunction } from './1796860800000-ReviewItemRefresh';

const ISO = (col: string): string => `to_char(${col} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/**
 * The refresh, now also writing `doc`: the piece's row of the review list as the API sends it
 * (`reviewRowSchema` in shared/api/review.ts, all but `daysToShip`, which depends on the day it is read).
 * A change to that contract needs a migration that redefines this; the API tests parse the list with it.
 */
export const REFRESH_DOC = `
        DELETE FROM review_item r WHERE r.piece_id = ANY(ids)
           AND NOT EXISTS (SELECT 1 FROM piece_flag f WHERE f.piece_id = r.piece_id AND f.cleared_at IS NULL);
        INSERT INTO review_item (piece_id, plant_id, job_id, design_id, mark, bay, status, ship_date, max_severity, last_serious_at,
                                 flag_kinds, flags, decision_kind, decided_at, needs_decision, doc)
        SELECT p.id, p.plant_id, p.job_id, p.design_id, p.mark, p.bay, p.status, p.ship_date, fl.max_severity, fl.last_serious_at,
               fl.kinds, fl.flags, ld.kind, ld.decided_at,
               fl.last_serious_at IS NOT NULL AND (ld.decided_at IS NULL OR fl.last_serious_at > ld.decided_at),
               json_build_object(
                 'pieceId', p.id, 'mark', p.mark, 'jobNumber', j.number, 'productType', d.product_type, 'bay', p.bay,
                 'status', p.status, 'shipDate', p.ship_date::text, 'flags', fl.flags,
                 'latest', CASE WHEN pr.latest_mm IS NULL THEN NULL ELSE json_build_object(
                   'mm', pr.latest_mm::float8, 'expectedMm', pr.latest_expected_mm::float8, 'lowMm', pr.latest_low_mm::float8, 'highMm', pr.latest_high_mm::float8) END,
                 'atShip', CASE WHEN pr.ship_mm IS NULL THEN NULL ELSE json_build_object(
                   'mm', pr.ship_mm::float8, 'lowMm', pr.ship_low_mm::float8, 'highMm', pr.ship_high_mm::float8) END,
                 'lastDecision', CASE WHEN ld.kind IS NULL THEN NULL ELSE json_build_object('kind', ld.kind, 'at', ${ISO('ld.decided_at')}) END
               )::text
          FROM piece p
          JOIN job j ON j.id = p.job_id
          JOIN member_design d ON d.id = p.design_id
          LEFT JOIN projection pr ON pr.piece_id = p.id
          JOIN LATERAL (
            SELECT max(f.severity) AS max_severity,
                   max(f.raised_at) FILTER (WHERE f.severity >= 2) AS last_serious_at,
                   array_agg(f.kind ORDER BY f.kind) AS kinds,
                   jsonb_agg(jsonb_build_object('kind', f.kind, 'severity', f.severity, 'reason', f.reason, 'raisedAt', ${ISO('f.raised_at')})
                             ORDER BY f.severity DESC, f.raised_at) AS flags
              FROM piece_flag f WHERE f.piece_id = p.id AND f.cleared_at IS NULL
            HAVING count(*) > 0) fl ON true
          LEFT JOIN LATERAL (SELECT x.kind, x.decided_at FROM decision x WHERE x.piece_id = p.id ORDER BY x.decided_at DESC LIMIT 1) ld ON true
         WHERE p.id = ANY(ids)
        ON CONFLICT (piece_id) DO UPDATE SET
          plant_id = EXCLUDED.plant_id, job_id = EXCLUDED.job_id, design_id = EXCLUDED.design_id, mark = EXCLUDED.mark, bay = EXCLUDED.bay,
          status = EXCLUDED.status, ship_date = EXCLUDED.ship_date, max_severity = EXCLUDED.max_severity,
          last_serious_at = EXCLUDED.last_serious_at, flag_kinds = EXCLUDED.flag_kinds, flags = EXCLUDED.flags,
          decision_kind = EXCLUDED.decision_kind, decided_at = EXCLUDED.decided_at, needs_decision = EXCLUDED.needs_decision,
          doc = EXCLUDED.doc;
`;

/** What the row shows of a projection; a projection update that changes none of it leaves the row alone. */
export const SHOWN = 'latest_mm, latest_expected_mm, latest_low_mm, latest_high_mm, ship_mm, ship_low_mm, ship_high_mm';

/**
 * Each row of `review_item` keeps the JSON of its review-list row, so a page is its stored rows joined
 * as text: building the JSON of 50 rows on every request was most of the list's database time
 * (measured). Besides the triggers of ReviewItem, the row is now also refreshed when what it shows of
 * the projection, the job number or the design's product type changes.
 */
export class ReviewItemDoc1797206400000 implements MigrationInterface {
  name = 'ReviewItemDoc1797206400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE review_item ADD COLUMN doc text`);
    await q.query(refreshFunction(REFRESH_DOC));
    const hooks: Array<{ name: string; table: string; event: string; tables: string; pieces: string }> = [
      { name: 'projection_insert', table: 'projection', event: 'INSERT', tables: 'NEW TABLE AS new_rows', pieces: 'SELECT n.piece_id FROM new_rows n JOIN review_item r ON r.piece_id = n.piece_id' },
      {
        name: 'projection_update', table: 'projection', event: 'UPDATE', tables: 'OLD TABLE AS old_rows NEW TABLE AS new_rows',
        pieces: `SELECT n.piece_id FROM new_rows n JOIN old_rows o ON o.piece_id = n.piece_id JOIN review_item r ON r.piece_id = n.piece_id
                  WHERE (${SHOWN.split(', ').map((c) => `n.${c}`).join(', ')}) IS DISTINCT FROM (${SHOWN.split(', ').map((c) => `o.${c}`).join(', ')})`,
      },
      { name: 'projection_delete', table: 'projection', event: 'DELETE', tables: 'OLD TABLE AS old_rows', pieces: 'SELECT o.piece_id FROM old_rows o JOIN review_item r ON r.piece_id = o.piece_id' },
      {
        name: 'job_update', table: 'job', event: 'UPDATE', tables: 'OLD TABLE AS old_rows NEW TABLE AS new_rows',
        pieces: 'SELECT r.piece_id FROM new_rows n JOIN old_rows o ON o.id = n.id JOIN review_item r ON r.job_id = n.id WHERE n.number IS DISTINCT FROM o.number',
      },
      {
        name: 'design_update', table: 'member_design', event: 'UPDATE', tables: 'OLD TABLE AS old_rows NEW TABLE AS new_rows',
        pieces: 'SELECT r.piece_id FROM new_rows n JOIN old_rows o ON o.id = n.id JOIN review_item r ON r.design_id = n.id WHERE n.product_type IS DISTINCT FROM o.product_type',
      },
    ];
    for (const h of hooks) {
      await q.query(`
        CREATE FUNCTION review_item_${h.name}() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN
          PERFORM review_item_refresh(ARRAY(${h.pieces} ORDER BY 1));
          RETURN NULL;
        END $$`);
      await q.query(`CREATE TRIGGER review_item_${h.name} AFTER ${h.event} ON ${h.table} REFERENCING ${h.tables} FOR EACH STATEMENT EXECUTE FUNCTION review_item_${h.name}()`);
    }
    await q.query(`SELECT review_item_refresh(ARRAY(SELECT piece_id FROM review_item))`);
    await q.query(`ALTER TABLE review_item ALTER COLUMN doc SET NOT NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const [name, table] of [['projection_insert', 'projection'], ['projection_update', 'projection'], ['projection_delete', 'projection'], ['job_update', 'job'], ['design_update', 'member_design']]) {
      await q.query(`DROP TRIGGER review_item_${name} ON ${table}`);
      await q.query(`DROP FUNCTION review_item_${name}()`);
    }
    await q.query(refreshWithIsoTimes());
    await q.query(`ALTER TABLE review_item DROP COLUMN doc`);
  }
}
