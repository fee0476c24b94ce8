import type { ArrangeInput, BayCandidateDto, BayDetail } from '#shared/api/bays';
import type { SessionUser } from '#shared/api/auth';
import { arrangementDifferences, proposeBay } from '#shared/bays/match';
import { DEFAULT_BAND_Z, DEFAULT_TOLERANCE_RULES, differentialToleranceFor } from '#shared/camber/tolerance';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { AppError, notFound } from '../http/errors';
import { checkBay } from '../projections/projection.service';
import { familySettings } from '../settings/settings.repository';

const DAY = 86_400_000;

/** Viewers see their own job only. */
function jobGuard(user: SessionUser, jobId: string): void {
  if (user.role === 'viewer' && user.jobId !== jobId) throw notFound('the bay');
}

export async function listBays(d: Deps, user: SessionUser, jobId?: string): Promise<Array<{ jobId: string; jobNumber: string; bay: string; pieces: number }>> {
  const args: unknown[] = [user.plantId];
  let extra = '';
  const job = user.role === 'viewer' ? user.jobId : jobId;
  if (job) {
    args.push(job);
    extra = ' AND p.job_id = $2';
  }
  const rows: Array<{ job_id: string; number: string; bay: string; pieces: number }> = await d.ds.query(
    `SELECT p.job_id, j.number, p.bay, count(*)::int AS pieces FROM piece p JOIN job j ON j.id = p.job_id
      WHERE p.plant_id = $1 AND p.bay IS NOT NULL AND p.status <> 'shipped'${extra} GROUP BY 1, 2, 3 ORDER BY 2, 3`,
    args,
  );
  return rows.map((r) => ({ jobId: r.job_id, jobNumber: r.number, bay: r.bay, pieces: r.pieces }));
}

/**
 * A bay with its current arrangement, the pool of interchangeable pieces (same job and design, in the
 * yard, not in another bay) and the proposal. σ of a projection comes from its stored interval.
 */
export async function bayDetail(d: Deps, user: SessionUser, jobId: string, bay: string, now = new Date()): Promise<BayDetail> {
  jobGuard(user, jobId);
  const rows: Array<Record<string, unknown>> = await d.ds.query(
    `WITH bay_designs AS (SELECT DISTINCT design_id FROM piece WHERE plant_id = $1 AND job_id = $2 AND bay = $3)
     SELECT p.id, p.mark, p.status, p.bay, p.bay_position, p.cast_date::text AS cast_date, md.product_type, md.spec->>'length' AS length, md.spec->>'units' AS units,
            pr.erection_mm, pr.erection_low_mm, pr.erection_high_mm, j.number AS job_number
       FROM piece p JOIN member_design md ON md.id = p.design_id JOIN job j ON j.id = p.job_id
       LEFT JOIN projection pr ON pr.piece_id = p.id
      WHERE p.plant_id = $1 AND p.job_id = $2 AND p.design_id IN (SELECT design_id FROM bay_designs)
        AND p.status <> 'shipped' AND (p.bay = $3 OR (p.bay IS NULL AND p.status NOT IN ('hold', 'engineering')))
      ORDER BY p.bay_position NULLS LAST, p.mark`,
    [user.plantId, jobId, bay],
  );
  const inBay = rows.filter((r) => r.bay === bay);
  if (inBay.length === 0) throw notFound('the bay');
  const r0 = inBay[0]!;
  const lengthFt = r0.units === 'si' ? (Number(r0.length) * 1000) / 25.4 / 12 : Number(r0.length);
  const fs = await familySettings(d.ds, user.plantId, String(r0.product_type));
  const rule = { ...(DEFAULT_TOLERANCE_RULES[String(r0.product_type) as keyof typeof DEFAULT_TOLERANCE_RULES] ?? DEFAULT_TOLERANCE_RULES['double-tee']), differentialPer10ft: fs.tolerance.differentialPer10ft, differentialCap: fs.tolerance.differentialCap };
  const toleranceMm = differentialToleranceFor(rule, lengthFt) * 25.4;
  const toCandidate = (r: Record<string, unknown>): BayCandidateDto => ({
    id: String(r.id),
    mark: String(r.mark),
    status: r.status as BayCandidateDto['status'],
    position: (r.bay_position as number | null) ?? null,
    inBay: r.bay === bay,
    camberMm: Number(r.erection_mm),
    sigmaMm: (Number(r.erection_high_mm) - Number(r.erection_low_mm)) / (2 * DEFAULT_BAND_Z),
    ageDays: Math.floor((now.getTime() - Date.parse(`${r.cast_date as string}T00:00:00Z`)) / DAY),
    // A piece already cleared to ship for this bay stays in it.
    committed: r.bay === bay && r.status === 'cleared',
  });
  const projected = rows.filter((r) => r.erection_mm !== null);
  const withoutProjection = rows.filter((r) => r.erection_mm === null).map((r) => String(r.mark));
  const pool = projected.map(toCandidate);
  const current = pool.filter((p) => p.inBay).sort((a, b) => (a.position ?? 99) - (b.position ?? 99));
  const positions = inBay.length;
  const proposal = proposeBay(pool.filter((p) => p.status !== 'shipped'), { positions, toleranceMm });
  return {
    jobId,
    jobNumber: String(r0.job_number),
    bay,
    positions,
    toleranceMm,
    current,
    currentDifferencesMm: arrangementDifferences(current, {}),
    pool,
    withoutProjection,
    proposal: {
      feasible: proposal.feasible,
      order: proposal.order.map((p) => p.id),
      worstMm: Number.isFinite(proposal.worstMm) ? proposal.worstMm : -1,
      marginMm: Number.isFinite(proposal.marginMm) ? proposal.marginMm : -1,
      differencesMm: proposal.differencesMm,
      reason: proposal.reason ?? null,
    },
  };
}

/** Sets the bay's pieces and positions (a proposal accepted, or a hand placement), audited. */
export async function arrangeBay(d: Deps, user: SessionUser, input: ArrangeInput): Promise<BayDetail> {
  const detail = await bayDetail(d, user, input.jobId, input.bay);
  const pool = new Map(detail.pool.map((p) => [p.id, p]));
  const unknown = input.pieceIds.filter((id) => !pool.has(id));
  if (unknown.length) throw new AppError(400, 'validation_failed', 'some pieces cannot stand in this bay (another job or design, shipped, held, or in another bay)', { pieceIds: unknown.map((id) => `not eligible: ${id}`) });
  const dropped = detail.current.filter((p) => p.committed && !input.pieceIds.includes(p.id));
  if (dropped.length) throw new AppError(409, 'conflict', `pieces cleared for this bay must stay in it: ${dropped.map((p) => p.mark).join(', ')}`);
  await d.ds.transaction(async (tx) => {
    await tx.query(`UPDATE piece SET bay = NULL, bay_position = NULL, version = version + 1, updated_at = now() WHERE plant_id = $1 AND job_id = $2 AND bay = $3 AND NOT (id = ANY($4::uuid[]))`, [user.plantId, input.jobId, input.bay, input.pieceIds]);
    for (const [i, id] of input.pieceIds.entries()) {
      await tx.query(`UPDATE piece SET bay = $2, bay_position = $3, version = version + 1, updated_at = now() WHERE id = $1`, [id, input.bay, i + 1]);
    }
    await audit(tx, { plantId: user.plantId, userId: user.id, action: 'arrange-bay', entity: 'bay', entityId: `${input.jobId}/${input.bay}`, before: detail.current.map((p) => p.mark), after: input.pieceIds.map((id) => pool.get(id)!.mark) });
  });
  await checkBay(d, user.plantId, input.jobId, input.bay, user.unitSystem === 'si' ? 'mm' : 'in');
  return bayDetail(d, user, input.jobId, input.bay);
}
