import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { SessionUser } from '#shared/api/auth';
import type { PiecePage, pieceListQuerySchema } from '#shared/api/pieces';
import { isoSql, JsonText, numSql } from '../db/json-sql';
import { preparedRows } from '../db/prepared';

type ListQuery = z.output<typeof pieceListQuerySchema>;

/** Sort keys to columns of a page's rows (never user text in SQL). */
const SORT_SQL: Record<ListQuery['sort'], string> = {
  mark: 'x.mark',
  castDate: 'x.cast_date',
  shipDate: 'x.ship_date',
  status: 'x.status',
  job: 'x.job_number',
};

/** The same sort keys on the piece and job tables, for paging before the page's rows are built. */
const BASE_SORT_SQL: Record<ListQuery['sort'], string> = {
  mark: 'p.mark',
  castDate: 'p.cast_date',
  shipDate: 'p.ship_date',
  status: 'p.status',
  job: 'j.number',
};

/** A piece with its job, design and latest live reading: the tables the piece JSON below reads. */
export const PIECE_FROM = `
    piece p
    JOIN job j ON j.id = p.job_id
    JOIN member_design d ON d.id = p.design_id
    LEFT JOIN LATERAL (
      SELECT r.value_mm, r.taken_at FROM reading r
       WHERE r.piece_id = p.id AND r.superseded_by IS NULL
       ORDER BY r.taken_at DESC LIMIT 1) lr ON true`;

/** A piece row as the API describes it (`pieceRowSchema`, plus `version` on the piece page), over PIECE_FROM. */
export const pieceJson = (withVersion: boolean): string => `json_build_object(
    'id', p.id, 'mark', p.mark, 'jobId', p.job_id, 'jobNumber', j.number, 'designId', p.design_id, 'designCode', d.code,
    'productType', d.product_type, 'bed', p.bed, 'castDate', p.cast_date::text, 'releaseDate', p.release_date::text,
    'shipDate', p.ship_date::text, 'erectionDate', p.erection_date::text, 'bay', p.bay, 'bayPosition', p.bay_position,
    'status', p.status,
    'latestReading', CASE WHEN lr.value_mm IS NULL THEN NULL
                     ELSE json_build_object('valueMm', ${numSql('lr.value_mm')}, 'takenAt', ${isoSql('lr.taken_at')}) END${withVersion ? `,
    'version', p.version` : ''})`;

/** Marks compare without spaces, dashes or case: "dt 104", "DT-104" and "dt104" are one mark. */
export const markKey = (s: string): string => s.toLowerCase().replace(/[^a-z0-9]/g, '');

/**
 * A page of the plant's pieces: paged on the piece's own columns first (an index per sort key), then the
 * latest reading read for the page's rows only, so a page never sorts every piece of the plant; the
 * total is summed from kept counts unless the page searches by mark.
 */
export async function listPieces(ds: DataSource, user: SessionUser, q: ListQuery): Promise<JsonText<PiecePage>> {
  const where = ['p.plant_id = $1'];
  const args: unknown[] = [user.plantId];
  const add = (sql: string, v: unknown): void => {
    args.push(v);
    where.push(sql.replace('?', `$${args.length}`));
  };
  const search = q.q ? markKey(q.q) : '';
  if (user.role === 'viewer') add('p.job_id = ?', user.jobId);
  if (search) add(`p.mark_key LIKE '%' || ? || '%'`, search);
  if (q.status) add('p.status = ?', q.status);
  if (q.productType) add('p.design_id IN (SELECT id FROM member_design WHERE plant_id = $1 AND product_type = ?)', q.productType);
  if (q.jobId) add('p.job_id = ?', q.jobId);
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  const filter = where.join(' AND ');
  // Without a mark search every filter is a column of the kept counts (migration PieceCount), named
  // as on the piece, so the same conditions select them; a search is counted.
  const total = search ? `(SELECT count(*) FROM piece p WHERE ${filter})` : `(SELECT coalesce(sum(p.n), 0) FROM piece_count p WHERE ${filter})`;
  const n = args.push(q.pageSize, (q.page - 1) * q.pageSize, q.page);
  const [row] = await preparedRows<{ body: string }>(
    ds,
    `WITH page AS (SELECT p.id FROM piece p ${q.sort === 'job' ? 'JOIN job j ON j.id = p.job_id' : ''} WHERE ${filter} ORDER BY ${BASE_SORT_SQL[q.sort]} ${dir} NULLS LAST, p.mark ASC LIMIT $${n - 2} OFFSET $${n - 1})
     SELECT json_build_object(
              'items', coalesce((SELECT json_agg(x.doc ORDER BY ${SORT_SQL[q.sort]} ${dir} NULLS LAST, x.mark ASC) FROM page CROSS JOIN LATERAL (
                 SELECT ${pieceJson(false)} AS doc, p.mark, p.cast_date, p.ship_date, p.status, j.number AS job_number FROM ${PIECE_FROM} WHERE p.id = page.id) x), '[]'),
              'total', ${total},
              'page', $${n}::int, 'pageSize', $${n - 2}::int)::text AS body`,
    args,
  );
  return new JsonText(row!.body);
}

/** Folds the piece counts' delta rows (migration PieceCount). */
export async function compactPieceCounts(ds: DataSource): Promise<void> {
  await ds.query('SELECT piece_count_compact()');
}
