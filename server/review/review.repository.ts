import type { DataSource } from 'typeorm';
import type { SessionUser } from '#shared/api/auth';
import type { FlagDto, ReviewQuery, ReviewRow } from '#shared/api/review';
import type { PiecePage } from '#shared/api/pieces';
import { dateInZone } from '#shared/yard/schedule';
import { preparedRows } from '../db/prepared';

/** Sort keys to SQL (never user text in SQL). Urgency: ship date first, then the worst flag. */
const ORDER: Record<ReviewQuery['sort'], string> = {
  urgency: 'ship_date ASC NULLS LAST, max_severity DESC, mark ASC',
  mark: 'mark ASC',
  shipDate: 'ship_date ASC NULLS LAST, mark ASC',
};

/**
 * Flagged pieces of the plant. "needs-decision": an active flag of severity ≥ 2 raised after the
 * piece's latest decision (or with no decision yet). Served from `review_item`, the row per flagged
 * piece that triggers keep (migration ReviewItem), so a page is read off an index: the list neither runs
 * the engine, nor scans readings, nor aggregates every flag of the plant on each request.
 */
export async function reviewList(ds: DataSource, user: SessionUser, q: ReviewQuery): Promise<Omit<PiecePage, 'items'> & { items: ReviewRow[] }> {
  const where = ['r.plant_id = $1', `r.status <> 'shipped'`];
  const args: unknown[] = [user.plantId];
  const add = (sql: string, v: unknown): void => {
    args.push(v);
    where.push(sql.replaceAll('?', `$${args.length}`));
  };
  if (q.jobId) add('r.job_id = ?', q.jobId);
  if (q.productType) add('r.design_id IN (SELECT id FROM member_design WHERE plant_id = $1 AND product_type = ?)', q.productType);
  if (q.bay) add('r.bay = ?', q.bay);
  if (q.flag) add('? = ANY(r.flag_kinds)', q.flag);
  if (q.view === 'needs-decision') where.push('r.needs_decision');
  const filter = where.join(' AND ');
  args.push(q.pageSize, (q.page - 1) * q.pageSize);
  const rows = await preparedRows(
    ds,
    `WITH page AS (SELECT r.* FROM review_item r WHERE ${filter} ORDER BY ${ORDER[q.sort]} LIMIT $${args.length - 1} OFFSET $${args.length})
     SELECT page.piece_id AS id, page.mark, page.bay, page.status, page.ship_date::text AS ship_date, page.flags, page.decision_kind, page.decided_at,
            j.number AS job_number, d.product_type,
            pr.latest_mm, pr.latest_expected_mm, pr.latest_low_mm, pr.latest_high_mm, pr.ship_mm, pr.ship_low_mm, pr.ship_high_mm,
            (SELECT count(*) FROM review_item r WHERE ${filter}) AS total
       FROM page JOIN job j ON j.id = page.job_id JOIN member_design d ON d.id = page.design_id LEFT JOIN projection pr ON pr.piece_id = page.piece_id
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
    total: rows[0] ? Number(rows[0].total) : q.page > 1 ? await countOnly(ds, filter, args.slice(0, -2)) : 0,
    page: q.page,
    pageSize: q.pageSize,
  };
}

/** The total when the page asked for lies past the end (no row to carry it). */
async function countOnly(ds: DataSource, filter: string, args: unknown[]): Promise<number> {
  const [row] = await ds.query(`SELECT count(*) AS total FROM review_item r WHERE ${filter}`, args);
  return Number(row.total);
}
