import type { SessionUser } from '#shared/api/auth';
import type { PieceDetail } from '#shared/api/piece-detail';
import type { Deps } from '../deps';
import { notFound } from '../http/errors';
import { readingsOfPiece } from '../readings/readings.repository';
import { PIECE_SELECT, toPieceRow } from './pieces.repository';

export async function pieceDetail(d: Deps, user: SessionUser, id: string): Promise<PieceDetail> {
  const args: unknown[] = [id, user.plantId];
  let extra = '';
  if (user.role === 'viewer') {
    args.push(user.jobId);
    extra = ' AND p.job_id = $3';
  }
  const rows: Array<Record<string, unknown>> = await d.ds.query(`${PIECE_SELECT} WHERE p.id = $1 AND p.plant_id = $2${extra}`, args);
  if (!rows[0]) throw notFound('the piece');
  const piece = toPieceRow(rows[0]);
  const designs: Array<Record<string, unknown>> = await d.ds.query(`SELECT id, code, name, version, product_type, spec FROM member_design WHERE id = $1`, [piece.designId]);
  const ds = designs[0]!;
  const decisions: Array<Record<string, unknown>> = await d.ds.query(
    `SELECT x.id, x.kind, x.comment, u.name AS decided_by, x.decided_at FROM decision x JOIN app_user u ON u.id = x.decided_by
      WHERE x.piece_id = $1 ORDER BY x.decided_at DESC`,
    [id],
  );
  return {
    piece,
    design: { id: String(ds.id), code: String(ds.code), name: String(ds.name), version: Number(ds.version), productType: String(ds.product_type), spec: ds.spec },
    readings: await readingsOfPiece(d.ds, id),
    decisions: decisions.map((x) => ({ id: String(x.id), kind: String(x.kind), comment: String(x.comment), decidedBy: String(x.decided_by), decidedAt: new Date(x.decided_at as string).toISOString() })),
  };
}

export async function listJobs(d: Deps, user: SessionUser): Promise<Array<{ id: string; number: string; name: string }>> {
  const rows: Array<{ id: string; number: string; name: string }> = await d.ds.query(
    `SELECT id, number, name FROM job WHERE plant_id = $1 ${user.role === 'viewer' ? 'AND id = $2' : ''} ORDER BY number`,
    user.role === 'viewer' ? [user.plantId, user.jobId] : [user.plantId],
  );
  return rows;
}
