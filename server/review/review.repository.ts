import type { DataSource } from 'typeorm';
import type { SessionUser } from '#shared/api/auth';
import type { ReviewPage, ReviewQuery } from '#shared/api/review';
import { JsonText } from '../db/json-sql';
import { keptPages } from '../db/kept-pages';
import { dateInZone } from '#shared/yard/schedule';
import { preparedRows } from '../db/prepared';

/** Sort keys to SQL over a `review_item` row named `t` (never user text in SQL). Urgency: ship date first, then the worst flag. */
const ORDER: Record<ReviewQuery['sort'], (t: string) => string> = {
  urgency: (t) => `${t}.ship_date ASC NULLS LAST, ${t}.max_severity DESC, ${t}.mark ASC`,
  mark: (t) => `${t}.mark ASC`,
  shipDate: (t) => `${t}.ship_date ASC NULLS LAST, ${t}.mark ASC`,
};

/**
 * Flagged pieces of the plant (`reviewPageSchema`). "needs-decision": an active flag of severity ≥ 2
 * raised after the piece's latest decision (or with no decision yet). Served from `review_item`, the row
 * per flagged piece that triggers keep (migration ReviewItem), so a page is read off an index: the list
 * neither runs the engine, nor scans readings, nor aggregates every flag of the plant on each request.
 *
 * A page built before is sent again while the plant's review revision (migration ReviewPageRevision) is
 * the one it was built at, read in the same statement; checking it is one small indexed sum. Pages are
 * kept per plant, day on the plant's clock (days to ship) and query.
 */
/** The plant's review revision: every statement that writes its `review_item` rows adds one. */
const REVISION = `(SELECT coalesce(sum(rev), 0) FROM review_count WHERE plant_id = $1)`;

export async function reviewList(ds: DataSource, user: SessionUser, q: ReviewQuery): Promise<JsonText<ReviewPage>> {
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
  // The unfiltered views' totals are kept (migration ReviewCount); a filtered view is counted.
  const unfiltered = !q.jobId && !q.productType && !q.bay && !q.flag;
  const total = unfiltered
    ? `(SELECT coalesce(sum(${q.view === 'needs-decision' ? 'needs_decision' : 'flagged'}), 0) FROM review_count WHERE plant_id = $1)`
    : `(SELECT count(*) FROM review_item r WHERE ${filter})`;
  // Days to ship count from today on the plant's clock.
  const today = dateInZone(new Date(), user.timeZone);
  const pages = keptPages(ds, 'review');
  const key = `${user.plantId}|${today}|${JSON.stringify(q)}`; // every query field, in the schema's order
  const kept = pages.get(key);
  if (kept) {
    const [now] = await preparedRows<{ rev: string }>(ds, `SELECT ${REVISION} AS rev`, [user.plantId]);
    if (now!.rev === kept.stamp) return new JsonText(kept.body);
  }
  const n = args.push(today, q.pageSize, (q.page - 1) * q.pageSize);
  // Each row's JSON is stored (migration ReviewItemDoc) but for its days to ship, which is put in front
  // of it here: PostgreSQL sends the page's rows in index order with the total beside each, and the
  // page is joined as text. (Joining it in SQL cost twice the page's read, measured: substr on UTF-8 text
  // counts every character, and string_agg sorted the rows again.)
  const rows = await preparedRows<{ total: string; rev: string; days: number | null; doc: string }>(
    ds,
    `SELECT ${total} AS total, ${REVISION} AS rev, r.ship_date - $${n - 2}::date AS days, r.doc FROM review_item r
      WHERE ${filter} ORDER BY ${ORDER[q.sort]('r')} LIMIT $${n - 1} OFFSET $${n}`,
    args,
  );
  // A page past the end has no row to carry the total; it is not kept (its total is read in another snapshot).
  const count = rows[0]?.total ?? (await preparedRows<{ total: string }>(ds, `SELECT ${total} AS total`, args.slice(0, n - 3)))[0]!.total;
  const items = rows.map((r) => `{"daysToShip":${r.days ?? 'null'},${r.doc.slice(1)}`).join(',');
  const body = `{"items":[${items}],"total":${Number(count)},"page":${q.page},"pageSize":${q.pageSize}}`;
  if (rows[0]) pages.set(key, { stamp: rows[0].rev, body });
  return new JsonText(body);
}

/** Folds the review totals' delta rows into one row per plant (migration ReviewCount). */
export async function compactReviewCounts(ds: DataSource): Promise<void> {
  await ds.query('SELECT review_count_compact()');
}
