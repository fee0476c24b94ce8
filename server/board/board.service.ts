import type { SessionUser } from '#shared/api/auth';
import type { Board, JobsStatus } from '#shared/api/board';
import { dateInZone } from '#shared/yard/schedule';
import type { Deps } from '../deps';

/** The yard board: the day's picture for QC managers and engineers, from stored results only. */
export async function board(d: Deps, user: SessionUser, now = new Date()): Promise<Board> {
  const today = dateInZone(now, user.timeZone);
  const p = user.plantId;
  const [byStatus, byFlag, readings, shipping, ratios] = await Promise.all([
    d.ds.query(`SELECT status, count(*)::int AS count FROM piece WHERE plant_id = $1 GROUP BY status ORDER BY status`, [p]),
    d.ds.query(`SELECT kind, count(*)::int AS count FROM piece_flag WHERE plant_id = $1 AND cleared_at IS NULL GROUP BY kind ORDER BY kind`, [p]),
    d.ds.query(`SELECT count(*)::int AS count FROM reading WHERE plant_id = $1 AND (taken_at AT TIME ZONE $2)::date = $3::date`, [p, user.timeZone, today]),
    d.ds.query(
      `SELECT p.id, p.mark, j.number, p.ship_date::text AS ship_date, p.status,
              (SELECT count(*)::int FROM piece_flag f WHERE f.piece_id = p.id AND f.cleared_at IS NULL AND f.severity >= 2) AS flags,
              EXISTS (SELECT 1 FROM decision x WHERE x.piece_id = p.id) AS decided
         FROM piece p JOIN job j ON j.id = p.job_id
        WHERE p.plant_id = $1 AND p.status <> 'shipped' AND p.ship_date BETWEEN $2::date AND $2::date + 6
        ORDER BY p.ship_date, p.mark`,
      [p, today],
    ),
    d.ds.query(`SELECT measured_ratio FROM projection WHERE plant_id = $1 AND measured_ratio IS NOT NULL`, [p]),
  ]);
  return {
    today,
    byStatus: byStatus as Board['byStatus'],
    byFlag: byFlag as Board['byFlag'],
    readingsToday: Number((readings as Array<{ count: number }>)[0]?.count ?? 0),
    shippingThisWeek: (shipping as Array<Record<string, unknown>>).map((r) => ({
      pieceId: String(r.id),
      mark: String(r.mark),
      jobNumber: String(r.number),
      shipDate: String(r.ship_date),
      status: r.status as Board['shippingThisWeek'][number]['status'],
      flags: Number(r.flags),
      decided: Boolean(r.decided),
    })),
    ratios: (ratios as Array<{ measured_ratio: string }>).map((r) => Number(r.measured_ratio)),
  };
}

/** What the job queue holds, and the pieces whose last projection failed. */
export async function jobsStatus(d: Deps, user: SessionUser): Promise<JobsStatus> {
  const hasQueue = ((await d.ds.query(`SELECT to_regclass('pgboss.job') IS NOT NULL AS present`)) as Array<{ present: boolean }>)[0]?.present;
  const queues = hasQueue ? ((await d.ds.query(`SELECT name, state::text AS state, count(*)::int AS count FROM pgboss.job GROUP BY 1, 2 ORDER BY 1, 2`)) as JobsStatus['queues']) : [];
  const lastNightly = hasQueue
    ? ((await d.ds.query(`SELECT max(completed_on) AS at FROM pgboss.job WHERE name = 'projection-nightly' AND state = 'completed'`)) as Array<{ at: string | null }>)[0]?.at
    : null;
  const failures: Array<Record<string, unknown>> = await d.ds.query(
    `SELECT f.piece_id, p.mark, f.failed_at, f.message FROM projection_failure f JOIN piece p ON p.id = f.piece_id WHERE f.plant_id = $1 ORDER BY f.failed_at DESC LIMIT 100`,
    [user.plantId],
  );
  return {
    queues,
    failures: failures.map((f) => ({ pieceId: String(f.piece_id), mark: String(f.mark), failedAt: new Date(f.failed_at as string).toISOString(), message: String(f.message) })),
    lastNightly: lastNightly ? new Date(lastNightly).toISOString() : null,
  };
}
