import type { SessionUser } from '#shared/api/auth';
import type { PieceDetail } from '#shared/api/piece-detail';
import type { Deps } from '../deps';
import { isoSql, JsonText } from '../db/json-sql';
import { preparedRows } from '../db/prepared';
import { notFound } from '../http/errors';
import { READING_COLUMNS, READING_FROM } from '../readings/readings.repository';
import { PIECE_FROM, pieceJson } from './pieces.repository';

/**
 * The piece page (`pieceDetailSchema`): piece, design, readings (newest first) and decisions, as one
 * prepared statement that builds the JSON; it is the office's most used read, and one round trip with no
 * row mapping in Node is most of its cost. The readings come from a sorted subquery, the way the
 * PostgreSQL manual (§4.2.7, aggregate expressions) gives for ordering an aggregate's input: `json_agg`
 * has no partial form, so the rows reach it in the subquery's order.
 */
export async function pieceDetail(d: Deps, user: SessionUser, id: string): Promise<JsonText<PieceDetail>> {
  const args: unknown[] = [id, user.plantId];
  let extra = '';
  if (user.role === 'viewer') {
    args.push(user.jobId);
    extra = ' AND p.job_id = $3';
  }
  const [row] = await preparedRows<{ body: string }>(
    d.ds,
    `SELECT json_build_object(
        'piece', ${pieceJson(true)},
        'design', json_build_object('id', d.id, 'code', d.code, 'name', d.name, 'version', d.version, 'productType', d.product_type, 'spec', d.spec),
        'readings', coalesce((SELECT json_agg(x) FROM (SELECT ${READING_COLUMNS} FROM ${READING_FROM} WHERE r.piece_id = p.id ORDER BY r.taken_at DESC, r.received_at DESC) x), '[]'),
        'decisions', coalesce((SELECT json_agg(json_build_object('id', x.id, 'kind', x.kind, 'comment', x.comment, 'decidedBy', xu.name, 'decidedAt', ${isoSql('x.decided_at')}) ORDER BY x.decided_at DESC)
                                 FROM decision x JOIN app_user xu ON xu.id = x.decided_by WHERE x.piece_id = p.id), '[]')
      )::text AS body
       FROM ${PIECE_FROM}
      WHERE p.id = $1 AND p.plant_id = $2${extra}`,
    args,
  );
  if (!row) throw notFound('the piece');
  return new JsonText(row.body);
}

export async function listJobs(d: Deps, user: SessionUser): Promise<Array<{ id: string; number: string; name: string }>> {
  const rows: Array<{ id: string; number: string; name: string }> = await d.ds.query(
    `SELECT id, number, name FROM job WHERE plant_id = $1 ${user.role === 'viewer' ? 'AND id = $2' : ''} ORDER BY number`,
    user.role === 'viewer' ? [user.plantId, user.jobId] : [user.plantId],
  );
  return rows;
}
