import type { SessionUser } from '#shared/api/auth';
import type { PieceDetail } from '#shared/api/piece-detail';
import type { Deps } from '../deps';
import { preparedRows } from '../db/prepared';
import { notFound } from '../http/errors';
import { READING_SELECT, toReadingDto } from '../readings/readings.repository';
import { PIECE_SELECT, toPieceRow } from './pieces.repository';

export async function pieceDetail(d: Deps, user: SessionUser, id: string): Promise<PieceDetail> {
  const args: unknown[] = [id, user.plantId];
  let extra = '';
  if (user.role === 'viewer') {
    args.push(user.jobId);
    extra = ' AND p.job_id = $3';
  }
  // One statement for the whole page (piece, design, decisions, readings), prepared: it is a hot path,
  // and one round trip instead of four is most of its cost.
  const rows = await preparedRows(
    d.ds,
    `SELECT base.*, row_to_json(des) AS design, dec.list AS decisions, rd.list AS readings
       FROM (${PIECE_SELECT} WHERE p.id = $1 AND p.plant_id = $2${extra}) base
       JOIN LATERAL (SELECT id, code, name, version, product_type, spec FROM member_design WHERE id = base.design_id) des ON true
       JOIN LATERAL (
         SELECT coalesce(json_agg(x ORDER BY x.decided_at DESC), '[]') AS list
           FROM (SELECT x.id, x.kind, x.comment, u.name AS decided_by, x.decided_at FROM decision x JOIN app_user u ON u.id = x.decided_by WHERE x.piece_id = base.id) x) dec ON true
       JOIN LATERAL (
         SELECT coalesce(json_agg(r ORDER BY r.taken_at DESC, r.received_at DESC), '[]') AS list
           FROM (${READING_SELECT} WHERE r.piece_id = base.id) r) rd ON true`,
    args,
  );
  const row = rows[0];
  if (!row) throw notFound('the piece');
  const ds = row.design as Record<string, unknown>;
  return {
    piece: toPieceRow(row),
    design: { id: String(ds.id), code: String(ds.code), name: String(ds.name), version: Number(ds.version), productType: String(ds.product_type), spec: ds.spec },
    readings: (row.readings as Array<Record<string, unknown>>).map(toReadingDto),
    decisions: (row.decisions as Array<Record<string, unknown>>).map((x) => ({ id: String(x.id), kind: String(x.kind), comment: String(x.comment), decidedBy: String(x.decided_by), decidedAt: new Date(x.decided_at as string).toISOString() })),
  };
}

export async function listJobs(d: Deps, user: SessionUser): Promise<Array<{ id: string; number: string; name: string }>> {
  const rows: Array<{ id: string; number: string; name: string }> = await d.ds.query(
    `SELECT id, number, name FROM job WHERE plant_id = $1 ${user.role === 'viewer' ? 'AND id = $2' : ''} ORDER BY number`,
    user.role === 'viewer' ? [user.plantId, user.jobId] : [user.plantId],
  );
  return rows;
}
