import type { SessionUser } from '#shared/api/auth';
import type { ShipInput, ShippingRow } from '#shared/api/bays';
import { FLAG_LABELS, type FlagKind } from '#shared/projection/project';
import { dateInZone } from '#shared/yard/schedule';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { AppError, forbidden } from '../http/errors';

const DAY = 86_400_000;

const SELECT = `
  SELECT p.id, p.mark, j.number AS job_number, p.bay, p.bay_position, p.status, p.ship_date::text AS ship_date,
         ld.kind AS decision_kind, ld.decided_at, ld.by_name,
         lr.value_mm, lr.taken_at,
         pr.erection_mm, pr.erection_low_mm, pr.erection_high_mm,
         (SELECT coalesce(json_agg(json_build_object('kind', f.kind, 'raisedAt', f.raised_at)), '[]') FROM piece_flag f
           WHERE f.piece_id = p.id AND f.cleared_at IS NULL AND f.severity >= 2) AS flags
    FROM piece p JOIN job j ON j.id = p.job_id
    LEFT JOIN projection pr ON pr.piece_id = p.id
    LEFT JOIN LATERAL (SELECT x.kind, x.decided_at, u.name AS by_name FROM decision x JOIN app_user u ON u.id = x.decided_by
                        WHERE x.piece_id = p.id ORDER BY x.decided_at DESC LIMIT 1) ld ON true
    LEFT JOIN LATERAL (SELECT r.value_mm, r.taken_at FROM reading r WHERE r.piece_id = p.id AND r.superseded_by IS NULL
                        ORDER BY r.taken_at DESC LIMIT 1) lr ON true`;

/** Why a piece may not ship without a QC manager's override; empty when it may. */
function blockersOf(r: Record<string, unknown>, maxAge: number, now: Date): string[] {
  const out: string[] = [];
  const flags = (r.flags as Array<{ kind: FlagKind; raisedAt: string }>) ?? [];
  const decidedAt = r.decided_at ? Date.parse(r.decided_at as string) : 0;
  const undecided = flags.filter((f) => Date.parse(f.raisedAt) > decidedAt);
  if (undecided.length) out.push(`flagged without a decision: ${undecided.map((f) => FLAG_LABELS[f.kind]).join(', ')}`);
  if (r.status === 'hold') out.push('on hold');
  if (r.status === 'engineering') out.push('in engineering review');
  if (!r.taken_at) out.push('no reading');
  else {
    const age = Math.floor((now.getTime() - Date.parse(r.taken_at as string)) / DAY);
    if (age > maxAge) out.push(`last reading ${age} days old (the limit is ${maxAge})`);
  }
  return out;
}

function toRow(r: Record<string, unknown>, maxAge: number, now: Date): ShippingRow {
  return {
    pieceId: String(r.id),
    mark: String(r.mark),
    jobNumber: String(r.job_number),
    bay: (r.bay as string | null) ?? null,
    position: (r.bay_position as number | null) ?? null,
    status: r.status as ShippingRow['status'],
    lastDecision: r.decision_kind ? { kind: String(r.decision_kind), at: new Date(r.decided_at as string).toISOString(), by: String(r.by_name) } : null,
    flags: ((r.flags as Array<{ kind: FlagKind }>) ?? []).map((f) => FLAG_LABELS[f.kind]),
    latestReading: r.taken_at ? { mm: Number(r.value_mm), takenAt: new Date(r.taken_at as string).toISOString(), ageDays: Math.floor((now.getTime() - Date.parse(r.taken_at as string)) / DAY) } : null,
    atErection: r.erection_mm == null ? null : { mm: Number(r.erection_mm), lowMm: Number(r.erection_low_mm), highMm: Number(r.erection_high_mm) },
    blockers: blockersOf(r, maxAge, now),
  };
}

export async function shippingList(d: Deps, user: SessionUser, date: string, now = new Date()) {
  const rows: Array<Record<string, unknown>> = await d.ds.query(`${SELECT} WHERE p.plant_id = $1 AND p.ship_date = $2::date AND p.status <> 'shipped' ORDER BY j.number, p.bay, p.bay_position, p.mark`, [user.plantId, date]);
  return { date, readingMaxAgeDays: d.cfg.SHIP_READING_MAX_AGE_DAYS, rows: rows.map((r) => toRow(r, d.cfg.SHIP_READING_MAX_AGE_DAYS, now)) };
}

/**
 * Marks pieces shipped. The rules are enforced here, not only in the screen: a piece that is flagged
 * without a decision, on hold, in engineering review, or without a recent reading ships only with a QC
 * manager's override and a comment, recorded in the audit log.
 */
export async function ship(d: Deps, user: SessionUser, input: ShipInput, now = new Date()): Promise<{ shipped: string[] }> {
  return d.ds.transaction(async (tx) => {
    const rows: Array<Record<string, unknown>> = await tx.query(`${SELECT} WHERE p.plant_id = $1 AND p.id = ANY($2::uuid[]) FOR UPDATE OF p`, [user.plantId, input.pieceIds]);
    if (rows.length !== input.pieceIds.length) throw new AppError(404, 'not_found', 'some pieces were not found');
    const blocked = rows.map((r) => ({ mark: String(r.mark), status: String(r.status), blockers: blockersOf(r, d.cfg.SHIP_READING_MAX_AGE_DAYS, now) }));
    if (blocked.some((b) => b.status === 'shipped')) throw new AppError(409, 'conflict', `already shipped: ${blocked.filter((b) => b.status === 'shipped').map((b) => b.mark).join(', ')}`);
    const needOverride = blocked.filter((b) => b.blockers.length);
    if (needOverride.length) {
      if (user.role !== 'qc_manager') throw forbidden(`only a QC manager can ship ${needOverride.map((b) => b.mark).join(', ')}: ${needOverride.map((b) => `${b.mark} — ${b.blockers.join('; ')}`).join(' | ')}`);
      if (!input.overrideComment || input.overrideComment.length < 5) {
        throw new AppError(409, 'override_required', 'these pieces need an override with a comment before they ship', { overrideComment: needOverride.map((b) => `${b.mark}: ${b.blockers.join('; ')}`) });
      }
    }
    await tx.query(`UPDATE piece SET status = 'shipped', version = version + 1, updated_at = now() WHERE id = ANY($1::uuid[])`, [input.pieceIds]);
    for (const r of rows) {
      const b = blocked.find((x) => x.mark === r.mark)!;
      await audit(tx, {
        plantId: user.plantId, userId: user.id, action: b.blockers.length ? 'ship-override' : 'ship', entity: 'piece', entityId: String(r.id),
        before: { status: r.status }, after: { status: 'shipped', date: dateInZone(now, user.timeZone), ...(b.blockers.length ? { override: input.overrideComment, blockers: b.blockers } : {}) },
      });
    }
    return { shipped: rows.map((r) => String(r.id)) };
  });
}
