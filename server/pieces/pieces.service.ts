import type { SessionUser } from '#shared/api/auth';
import type { PieceDetail } from '#shared/api/piece-detail';
import type { Deps } from '../deps';
import { isoSql, JsonText } from '../db/json-sql';
import { preparedRows } from '../db/prepared';
import { notFound } from '../http/errors';
import { READING_COLUMNS, READING_FROM } from '../readings/readings.repository';
import { keptPages } from '../db/kept-pages';
import { PIECE_FROM, pieceJson } from './pieces.repository';

/** Who may see the piece: the user's plant, and a viewer's job only. */
function access(user: SessionUser, id: string): { args: unknown[]; where: string } {
  if (user.role === 'viewer') return { args: [id, user.plantId, user.jobId], where: 'p.id = $1 AND p.plant_id = $2 AND p.job_id = $3' };
  return { args: [id, user.plantId], where: 'p.id = $1 AND p.plant_id = $2' };
}

/** The page's revision: changes to the piece, its readings, photos and decisions, then plant-wide ones. */
const STAMP = `coalesce(pp.rev, 0) || '.' || pl.page_gen`;
const STAMP_FROM = 'JOIN plant pl ON pl.id = p.plant_id LEFT JOIN piece_page pp ON pp.piece_id = p.id';

/**
 * The piece page (`pieceDetailSchema`): piece, design, readings (newest first) and decisions, as one
 * prepared statement that builds the JSON; it is the office's most used read, and one round trip with no
 * row mapping in Node is most of its cost. The readings come from a sorted subquery, the way the
 * PostgreSQL manual (§4.2.7, aggregate expressions) gives for ordering an aggregate's input: `json_agg`
 * has no partial form, so the rows reach it in the subquery's order.
 *
 * A page built before is sent again when the piece's revision, read by one indexed lookup that also
 * checks access, is the one it was built at; the revision is read with the page, in the same snapshot.
 */
export async function pieceDetail(d: Deps, user: SessionUser, id: string): Promise<JsonText<PieceDetail>> {
  const { args, where } = access(user, id);
  const pages = keptPages(d.ds, 'piece');
  const kept = pages.get(id);
  if (kept) {
    const [now] = await preparedRows<{ stamp: string }>(d.ds, `SELECT ${STAMP} AS stamp FROM piece p ${STAMP_FROM} WHERE ${where}`, args);
    if (!now) throw notFound('the piece');
    if (now.stamp === kept.stamp) return new JsonText(kept.body);
  }
  const [row] = await preparedRows<{ body: string; stamp: string }>(
    d.ds,
    `SELECT json_build_object(
        'piece', ${pieceJson(true)},
        'design', json_build_object('id', d.id, 'code', d.code, 'name', d.name, 'version', d.version, 'productType', d.product_type, 'spec', d.spec),
        'readings', coalesce((SELECT json_agg(x) FROM (SELECT ${READING_COLUMNS} FROM ${READING_FROM} WHERE r.piece_id = p.id ORDER BY r.taken_at DESC, r.received_at DESC) x), '[]'),
        'decisions', coalesce((SELECT json_agg(json_build_object('id', x.id, 'kind', x.kind, 'comment', x.comment, 'decidedBy', xu.name, 'decidedAt', ${isoSql('x.decided_at')}) ORDER BY x.decided_at DESC)
                                 FROM decision x JOIN app_user xu ON xu.id = x.decided_by WHERE x.piece_id = p.id), '[]')
      )::text AS body, ${STAMP} AS stamp
       FROM ${PIECE_FROM} ${STAMP_FROM}
      WHERE ${where}`,
    args,
  );
  if (!row) throw notFound('the piece');
  pages.set(id, row);
  return new JsonText(row.body);
}

export async function listJobs(d: Deps, user: SessionUser): Promise<Array<{ id: string; number: string; name: string }>> {
  const rows: Array<{ id: string; number: string; name: string }> = await d.ds.query(
    `SELECT id, number, name FROM job WHERE plant_id = $1 ${user.role === 'viewer' ? 'AND id = $2' : ''} ORDER BY number`,
    user.role === 'viewer' ? [user.plantId, user.jobId] : [user.plantId],
  );
  return rows;
}
