import type { SessionUser } from '#shared/api/auth';
import type { FlagDto, PieceProjection } from '#shared/api/review';
import type { Deps } from '../deps';
import { notFound } from '../http/errors';
import { curvePoints } from './stored-result';

/** The stored projection of a piece with its active flags (viewers: only pieces of their job). */
export async function pieceProjection(d: Deps, user: SessionUser, pieceId: string): Promise<PieceProjection> {
  const args: unknown[] = [pieceId, user.plantId];
  if (user.role === 'viewer') args.push(user.jobId);
  const pieces: unknown[] = await d.ds.query(`SELECT 1 FROM piece WHERE id = $1 AND plant_id = $2 ${user.role === 'viewer' ? 'AND job_id = $3' : ''}`, args);
  if (pieces.length === 0) throw notFound('the piece');
  const [pr] = (await d.ds.query(`SELECT * FROM projection WHERE piece_id = $1`, [pieceId])) as Array<Record<string, unknown>>;
  const flags: Array<{ kind: FlagDto['kind']; severity: number; reason: string; raised_at: string }> = await d.ds.query(
    `SELECT kind, severity, reason, raised_at FROM piece_flag WHERE piece_id = $1 AND cleared_at IS NULL ORDER BY severity DESC, raised_at`,
    [pieceId],
  );
  const [failure] = (await d.ds.query(`SELECT message FROM projection_failure WHERE piece_id = $1`, [pieceId])) as Array<{ message: string }>;
  const num = (v: unknown): number => Number(v);
  const range = (a: unknown, lo: unknown, hi: unknown): { mm: number; lowMm: number; highMm: number } | null => (a == null ? null : { mm: num(a), lowMm: num(lo), highMm: num(hi) });
  return {
    projection: pr
      ? {
          computedAt: new Date(pr.computed_at as string).toISOString(),
          method: String(pr.method),
          readingsUsed: num(pr.readings_used),
          growthFactor: num(pr.growth_factor),
          growthFactorSd: num(pr.growth_factor_sd),
          elasticFactor: num(pr.elastic_factor),
          toleranceMm: num(pr.tolerance_mm),
          differentialMm: num(pr.differential_mm),
          atShip: range(pr.ship_mm, pr.ship_low_mm, pr.ship_high_mm),
          atErection: range(pr.erection_mm, pr.erection_low_mm, pr.erection_high_mm),
          note: String(pr.note),
          curve: curvePoints(pr.curve as Buffer),
        }
      : null,
    flags: flags.map((f) => ({ kind: f.kind, severity: f.severity, reason: f.reason, raisedAt: new Date(f.raised_at).toISOString() })),
    failure: failure?.message ?? null,
  };
}
