import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { SessionUser } from '#shared/api/auth';
import type { PiecePage, PieceRow, pieceListQuerySchema } from '#shared/api/pieces';

type ListQuery = z.output<typeof pieceListQuerySchema>;

/** Sort keys to columns of the PIECE_SELECT result (never user text in SQL). */
const SORT_SQL: Record<ListQuery['sort'], string> = {
  mark: 'mark',
  castDate: 'cast_date',
  shipDate: 'ship_date',
  status: 'status',
  job: 'job_number',
};

/** The same sort keys on the piece and job tables, for paging before the page's rows are built. */
const BASE_SORT_SQL: Record<ListQuery['sort'], string> = {
  mark: 'p.mark',
  castDate: 'p.cast_date',
  shipDate: 'p.ship_date',
  status: 'p.status',
  job: 'j.number',
};

export const PIECE_SELECT = `
  SELECT p.id, p.mark, p.job_id, j.number AS job_number, p.design_id, d.code AS design_code, d.product_type,
         p.bed, p.cast_date::text AS cast_date, p.release_date::text AS release_date, p.ship_date::text AS ship_date,
         p.erection_date::text AS erection_date, p.bay, p.bay_position, p.status, p.version,
         lr.value_mm AS latest_mm, lr.taken_at AS latest_at
    FROM piece p
    JOIN job j ON j.id = p.job_id
    JOIN member_design d ON d.id = p.design_id
    LEFT JOIN LATERAL (
      SELECT r.value_mm, r.taken_at FROM reading r
       WHERE r.piece_id = p.id AND r.superseded_by IS NULL
       ORDER BY r.taken_at DESC LIMIT 1) lr ON true`;

export function toPieceRow(r: Record<string, unknown>): PieceRow & { version: number } {
  return {
    id: String(r.id),
    mark: String(r.mark),
    jobId: String(r.job_id),
    jobNumber: String(r.job_number),
    designId: String(r.design_id),
    designCode: String(r.design_code),
    productType: String(r.product_type),
    bed: (r.bed as string | null) ?? null,
    castDate: String(r.cast_date),
    releaseDate: String(r.release_date),
    shipDate: (r.ship_date as string | null) ?? null,
    erectionDate: (r.erection_date as string | null) ?? null,
    bay: (r.bay as string | null) ?? null,
    bayPosition: (r.bay_position as number | null) ?? null,
    status: r.status as PieceRow['status'],
    version: Number(r.version),
    latestReading: r.latest_mm == null ? null : { valueMm: Number(r.latest_mm), takenAt: new Date(r.latest_at as string).toISOString() },
  };
}

/** Marks compare without spaces, dashes or case: "dt 104", "DT-104" and "dt104" are one mark. */
export const markKey = (s: string): string => s.toLowerCase().replace(/[^a-z0-9]/g, '');

export async function listPieces(ds: DataSource, user: SessionUser, q: ListQuery): Promise<PiecePage> {
  const where = ['p.plant_id = $1'];
  const args: unknown[] = [user.plantId];
  const add = (sql: string, v: unknown): void => {
    args.push(v);
    where.push(sql.replace('?', `$${args.length}`));
  };
  if (user.role === 'viewer') add('p.job_id = ?', user.jobId);
  if (q.q && markKey(q.q)) add(`p.mark_key LIKE '%' || ? || '%'`, markKey(q.q));
  if (q.status) add('p.status = ?', q.status);
  if (q.productType) add('p.design_id IN (SELECT id FROM member_design WHERE plant_id = $1 AND product_type = ?)', q.productType);
  if (q.jobId) add('p.job_id = ?', q.jobId);
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  args.push(q.pageSize, (q.page - 1) * q.pageSize);
  // Page on the piece's own columns first (an index per sort key), then read the latest reading for the
  // page's rows only; the total is counted apart, so the page never sorts every piece of the plant.
  const filter = where.join(' AND ');
  const [rows, [count]] = await Promise.all([
    ds.query(
      `WITH page AS (SELECT p.id FROM piece p ${q.sort === 'job' ? 'JOIN job j ON j.id = p.job_id' : ''} WHERE ${filter} ORDER BY ${BASE_SORT_SQL[q.sort]} ${dir} NULLS LAST, p.mark ASC LIMIT $${args.length - 1} OFFSET $${args.length})
       SELECT x.* FROM page CROSS JOIN LATERAL (${PIECE_SELECT} WHERE p.id = page.id) x
        ORDER BY ${SORT_SQL[q.sort]} ${dir} NULLS LAST, mark ASC`,
      args,
    ) as Promise<Array<Record<string, unknown>>>,
    ds.query(`SELECT count(*)::int AS total FROM piece p WHERE ${filter}`, args.slice(0, -2)) as Promise<Array<{ total: number }>>,
  ]);
  return {
    items: rows.map((r) => {
      const { version: _v, ...row } = toPieceRow(r);
      return row;
    }),
    total: count?.total ?? 0,
    page: q.page,
    pageSize: q.pageSize,
  };
}
