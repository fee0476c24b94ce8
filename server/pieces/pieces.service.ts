import type { SessionUser } from '#shared/api/auth';
import type { PieceDetail } from '#shared/api/piece-detail';
import type { Deps } from '../deps';
import { preparedRows } from '../db/prepared';
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
  const rows = await preparedRows(d.ds, `${PIECE_SELECT} WHERE p.id = $1 AND p.plant_id = $2${extra}`, args);
  if (!rows[0]) throw notFound('the piece');
  const piece = toPieceRow(rows[0]);
  // The rest is read side by side once the piece is known to be the user's (prepared: a hot path).
  const [designs, decisions, readings] = await Promise.all([
    preparedRows(d.ds, `SELECT id, code, name, version, product_type, spec FROM member_design WHERE id = $1`, [piece.designId]),
    preparedRows(
      d.ds,
      `SELECT x.id, x.kind, x.comment, u.name AS decided_by, x.decided_at FROM decision x JOIN app_user u ON u.id = x.decided_by
        WHERE x.piece_id = $1 ORDER BY x.decided_at DESC`,
      [id],
    ),
    readingsOfPiece(d.ds, id),
  ]);
  const ds = designs[0]!;
  return {
    piece,
    design: { id: String(ds.id), code: String(ds.code), name: String(ds.name), version: Number(ds.version), productType: String(ds.product_type), spec: ds.spec },
    readings,
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
