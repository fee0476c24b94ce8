import type { SessionUser } from '#shared/api/auth';
import type { YardPack } from '#shared/api/yard';
import { dateInZone, readingDue } from '#shared/yard/schedule';
import type { Deps } from '../deps';
import { familySettings } from '../settings/settings.repository';

/** The pieces still in the yard (not shipped) with their designs and whether a reading is due today. */
export async function yardPack(d: Deps, user: SessionUser, now = new Date()): Promise<YardPack> {
  const today = dateInZone(now, user.timeZone);
  const rows: Array<Record<string, unknown>> = await d.ds.query(
    `SELECT p.id, p.mark, j.number AS job_number, p.design_id, md.product_type, p.bed, p.cast_date::text AS cast_date,
            p.release_date::text AS release_date, p.ship_date::text AS ship_date, p.bay, p.status,
            lr.value_mm, lr.taken_at, (lr.taken_at AT TIME ZONE $2)::date::text AS last_date
       FROM piece p JOIN job j ON j.id = p.job_id JOIN member_design md ON md.id = p.design_id
       LEFT JOIN LATERAL (SELECT r.value_mm, r.taken_at FROM reading r WHERE r.piece_id = p.id AND r.superseded_by IS NULL
                          ORDER BY r.taken_at DESC LIMIT 1) lr ON true
      WHERE p.plant_id = $1 AND p.status <> 'shipped'
      ORDER BY p.mark`,
    [user.plantId, user.timeZone],
  );
  const designIds = [...new Set(rows.map((r) => String(r.design_id)))];
  const families = [...new Set(rows.map((r) => String(r.product_type)))];
  const ages = new Map(await Promise.all(families.map(async (f) => [f, (await familySettings(d.ds, user.plantId, f)).readingAges] as const)));
  const designs: Array<Record<string, unknown>> = designIds.length
    ? await d.ds.query(`SELECT id, code, version, product_type, spec FROM member_design WHERE id = ANY($1::uuid[])`, [designIds])
    : [];
  return {
    generatedAt: now.toISOString(),
    today,
    timeZone: user.timeZone,
    unitSystem: user.unitSystem,
    pieces: rows.map((r) => {
      const due = readingDue({ castDate: String(r.cast_date), releaseDate: String(r.release_date), lastReadingDate: (r.last_date as string | null) ?? null, today, ages: ages.get(String(r.product_type)) });
      return {
        id: String(r.id),
        mark: String(r.mark),
        jobNumber: String(r.job_number),
        designId: String(r.design_id),
        productType: String(r.product_type),
        bed: (r.bed as string | null) ?? null,
        castDate: String(r.cast_date),
        releaseDate: String(r.release_date),
        shipDate: (r.ship_date as string | null) ?? null,
        bay: (r.bay as string | null) ?? null,
        status: r.status as YardPack['pieces'][number]['status'],
        latestReading: r.value_mm == null ? null : { valueMm: Number(r.value_mm), takenAt: new Date(r.taken_at as string).toISOString() },
        due: due.due,
        overdue: due.overdue,
        dueSince: due.dueSince,
      };
    }),
    designs: designs.map((x) => ({ id: String(x.id), code: String(x.code), version: Number(x.version), productType: String(x.product_type), spec: x.spec })),
  };
}
