import type { DataSource } from 'typeorm';
import type { SessionUser } from '#shared/api/auth';
import type { FlagDto, ReviewQuery, ReviewRow } from '#shared/api/review';
import type { PiecePage } from '#shared/api/pieces';
import { dateInZone } from '#shared/yard/schedule';

/** Sort keys to SQL (never user text in SQL). Urgency: ship date first, then the worst flag. */
const ORDER: Record<ReviewQuery['sort'], string> = {
  urgency: 'ship_date ASC NULLS LAST, max_severity DESC, mark ASC',
  mark: 'mark ASC',
  shipDate: 'ship_date ASC NULLS LAST, mark ASC',
};

/**
 * Flagged pieces of the plant. "needs-decision": an active flag of severity ≥ 2 raised after the
 * piece's latest decision (or with no decision yet). Served from stored projections and flags, so the
 * list does not run the engine or scan readings.
 */
export async function reviewList(ds: DataSource, user: SessionUser, q: ReviewQuery): Promise<Omit<PiecePage, 'items'> & { items: ReviewRow[] }> {
  const where = ['p.plant_id = $1', `p.status <> 'shipped'`];
  const args: unknown[] = [user.plantId];
  const add = (sql: string, v: unknown): void => {
    args.push(v);
    where.push(sql.replaceAll('?', `$${args.length}`));
  };
  if (q.jobId) add('p.job_id = ?', q.jobId);
  if (q.productType) add('d.product_type = ?', q.productType);
  if (q.bay) add('p.bay = ?', q.bay);
  if (q.flag) add('EXISTS (SELECT 1 FROM piece_flag x WHERE x.piece_id = p.id AND x.cleared_at IS NULL AND x.kind = ?)', q.flag);
  const decisionGate = q.view === 'needs-decision' ? 'AND fl.last_serious IS NOT NULL AND (ld.decided_at IS NULL OR fl.last_serious > ld.decided_at)' : '';
  args.push(q.pageSize, (q.page - 1) * q.pageSize);
  // Start from the active flags (a partial index), not from every piece of the plant; order and page on
  // cheap columns first, then build the evidence (flags, projection, decision) for the page's rows only.
  const rows: Array<Record<string, unknown>> = await ds.query(
    `WITH flagged AS (
       SELECT f.piece_id, max(f.severity) AS max_severity, max(f.raised_at) FILTER (WHERE f.severity >= 2) AS last_serious
         FROM piece_flag f WHERE f.plant_id = $1 AND f.cleared_at IS NULL GROUP BY f.piece_id),
     base AS (
       SELECT p.id, p.mark, p.job_id, d.product_type, p.bay, p.status, p.ship_date::text AS ship_date, fl.max_severity, ld.kind AS decision_kind, ld.decided_at
         FROM flagged fl
         JOIN piece p ON p.id = fl.piece_id
         JOIN member_design d ON d.id = p.design_id
         LEFT JOIN LATERAL (SELECT kind, decided_at FROM decision WHERE piece_id = p.id ORDER BY decided_at DESC LIMIT 1) ld ON true
        WHERE ${where.join(' AND ')} ${decisionGate}),
     page AS (SELECT *, count(*) OVER () AS total FROM base ORDER BY ${ORDER[q.sort]} LIMIT $${args.length - 1} OFFSET $${args.length})
     SELECT page.*, j.number AS job_number,
            pr.latest_mm, pr.latest_expected_mm, pr.latest_low_mm, pr.latest_high_mm, pr.ship_mm, pr.ship_low_mm, pr.ship_high_mm,
            (SELECT json_agg(json_build_object('kind', x.kind, 'severity', x.severity, 'reason', x.reason, 'raisedAt', x.raised_at) ORDER BY x.severity DESC)
               FROM piece_flag x WHERE x.piece_id = page.id AND x.cleared_at IS NULL) AS flags
       FROM page JOIN job j ON j.id = page.job_id LEFT JOIN projection pr ON pr.piece_id = page.id
      ORDER BY ${ORDER[q.sort]}`,
    args,
  );
  const today = Date.parse(`${dateInZone(new Date(), user.timeZone)}T00:00:00Z`);
  const num = (v: unknown): number => Number(v);
  return {
    items: rows.map((r) => ({
      pieceId: String(r.id),
      mark: String(r.mark),
      jobNumber: String(r.job_number),
      productType: String(r.product_type),
      bay: (r.bay as string | null) ?? null,
      status: r.status as ReviewRow['status'],
      shipDate: (r.ship_date as string | null) ?? null,
      daysToShip: r.ship_date ? Math.round((Date.parse(`${r.ship_date as string}T00:00:00Z`) - today) / 86_400_000) : null,
      flags: ((r.flags as FlagDto[] | null) ?? []).map((f) => ({ ...f, raisedAt: new Date(f.raisedAt).toISOString() })),
      latest: r.latest_mm == null ? null : { mm: num(r.latest_mm), expectedMm: num(r.latest_expected_mm), lowMm: num(r.latest_low_mm), highMm: num(r.latest_high_mm) },
      atShip: r.ship_mm == null ? null : { mm: num(r.ship_mm), lowMm: num(r.ship_low_mm), highMm: num(r.ship_high_mm) },
      lastDecision: r.decision_kind ? { kind: String(r.decision_kind), at: new Date(r.decided_at as string).toISOString() } : null,
    })),
    total: rows[0] ? Number(rows[0].total) : 0,
    page: q.page,
    pageSize: q.pageSize,
  };
}
