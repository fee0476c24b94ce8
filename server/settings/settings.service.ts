import type { SessionUser } from '#shared/api/auth';
import { defaultFamilySettings, type CalibrationFamily, type FamilySettings } from '#shared/api/settings';
import { PRODUCT_TYPES, type ProductType } from '#shared/camber/schema';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { curvePoints } from '../projections/stored-result';
import { familySettings } from './settings.repository';

export async function listSettings(d: Deps, user: SessionUser) {
  const rows: Array<{ product_type: string; updated_at: string }> = await d.ds.query(`SELECT product_type, updated_at FROM family_setting WHERE plant_id = $1`, [user.plantId]);
  const stored = new Map(rows.map((r) => [r.product_type, r.updated_at]));
  return Promise.all(
    PRODUCT_TYPES.map(async (pt) => ({
      productType: pt,
      settings: await familySettings(d.ds, user.plantId, pt),
      stored: stored.has(pt),
      updatedAt: stored.has(pt) ? new Date(stored.get(pt)!).toISOString() : null,
    })),
  );
}

/** Saves a family's settings, audited, and re-runs the projections of the plant. */
export async function saveSettings(d: Deps, user: SessionUser, productType: ProductType, settings: FamilySettings): Promise<FamilySettings> {
  const before = await familySettings(d.ds, user.plantId, productType);
  await d.ds.transaction(async (tx) => {
    await tx.query(
      `INSERT INTO family_setting (plant_id, product_type, settings, updated_by) VALUES ($1, $2, $3, $4)
       ON CONFLICT (plant_id, product_type) DO UPDATE SET settings = EXCLUDED.settings, updated_by = EXCLUDED.updated_by, updated_at = now()`,
      [user.plantId, productType, JSON.stringify(settings), user.id],
    );
    await audit(tx, { plantId: user.plantId, userId: user.id, action: 'update-settings', entity: 'family_setting', entityId: productType, before, after: settings });
  });
  await d.jobs?.projectAll(user.plantId);
  return settings;
}

const DAY = 86_400_000;
const AGE_BUCKETS: Array<[string, number, number]> = [['at release (≤ 3 d)', 0, 3], ['3–28 d', 3, 28], ['28–90 d', 28, 90], ['over 90 d', 90, 100_000]];

/**
 * Measured ÷ predicted by product family and age, from the readings and the stored projection curves;
 * the fitted growth factor of a family is the mean of its pieces' calibrated factors (pieces with at least
 * two readings), with a normal 95 % interval on the mean.
 */
export async function calibrationView(d: Deps, user: SessionUser): Promise<CalibrationFamily[]> {
  const rows: Array<{ id: string; product_type: string; cast_date: string; curve: Buffer; growth_factor: string; readings_used: number }> = await d.ds.query(
    `SELECT p.id, md.product_type, p.cast_date::text AS cast_date, pr.curve, pr.growth_factor, pr.readings_used
       FROM piece p JOIN member_design md ON md.id = p.design_id JOIN projection pr ON pr.piece_id = p.id WHERE p.plant_id = $1`,
    [user.plantId],
  );
  const pieces = rows.map((p) => ({ ...p, curve: curvePoints(p.curve) }));
  const readings: Array<{ piece_id: string; taken_at: string; value_mm: string }> = await d.ds.query(
    `SELECT piece_id, taken_at, value_mm FROM reading WHERE plant_id = $1 AND superseded_by IS NULL AND coalesce(sky, '') <> 'sun-on-top'`,
    [user.plantId],
  );
  const byPiece = new Map<string, Array<{ taken_at: string; value_mm: string }>>();
  for (const r of readings) byPiece.set(r.piece_id, [...(byPiece.get(r.piece_id) ?? []), r]);
  const adopted: Array<{ product_type: string; growth_factor: string; growth_factor_sd: string; name: string; adopted_at: string }> = await d.ds.query(
    `SELECT DISTINCT ON (a.product_type) a.product_type, a.growth_factor, a.growth_factor_sd, u.name, a.adopted_at
       FROM calibration_adoption a JOIN app_user u ON u.id = a.adopted_by WHERE a.plant_id = $1 ORDER BY a.product_type, a.adopted_at DESC`,
    [user.plantId],
  );
  const families = [...new Set(pieces.map((p) => p.product_type))].sort();
  const stats = (xs: number[]): { mean: number | null; sd: number | null } => {
    if (xs.length === 0) return { mean: null, sd: null };
    const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
    const sd = xs.length > 1 ? Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1)) : null;
    return { mean, sd };
  };
  return families.map((family) => {
    const fam = pieces.filter((p) => p.product_type === family);
    const ratios: Array<{ age: number; ratio: number }> = [];
    for (const p of fam) {
      const cast = Date.parse(`${p.cast_date}T00:00:00Z`);
      for (const r of byPiece.get(p.id) ?? []) {
        const age = (Date.parse(r.taken_at) - cast) / DAY;
        const c = p.curve.reduce((a, b) => (Math.abs(b.ageDays - age) < Math.abs(a.ageDays - age) ? b : a), p.curve[0]!);
        if (c && Math.abs(c.camberMm) > 2) ratios.push({ age, ratio: Number(r.value_mm) / c.camberMm });
      }
    }
    const factors = fam.filter((p) => p.readings_used >= 2).map((p) => Number(p.growth_factor));
    const f = stats(factors);
    const a = adopted.find((x) => x.product_type === family);
    return {
      productType: family,
      pieces: factors.length,
      readings: ratios.length,
      growthFactorMean: f.mean,
      growthFactorSd: f.sd,
      interval: f.mean !== null && f.sd !== null ? [f.mean - (1.96 * f.sd) / Math.sqrt(factors.length), f.mean + (1.96 * f.sd) / Math.sqrt(factors.length)] : null,
      byAge: AGE_BUCKETS.map(([label, lo, hi]) => {
        const s = stats(ratios.filter((r) => r.age >= lo && r.age < hi).map((r) => r.ratio));
        return { label, count: ratios.filter((r) => r.age >= lo && r.age < hi).length, meanRatio: s.mean, sdRatio: s.sd };
      }),
      adopted: a ? { growthFactor: Number(a.growth_factor), growthFactorSd: Number(a.growth_factor_sd), by: a.name, at: new Date(a.adopted_at).toISOString() } : null,
    };
  });
}

/** Records an adopted factor (who, when, the evidence) and re-runs the projections, which use it as prior. */
export async function adoptFactor(d: Deps, user: SessionUser, productType: ProductType, growthFactor: number, growthFactorSd: number): Promise<void> {
  const view = (await calibrationView(d, user)).find((f) => f.productType === productType) ?? null;
  const evidence = view ? { pieces: view.pieces, readings: view.readings, mean: view.growthFactorMean, sd: view.growthFactorSd, interval: view.interval } : { pieces: 0 };
  await d.ds.transaction(async (tx) => {
    await tx.query(`INSERT INTO calibration_adoption (plant_id, product_type, growth_factor, growth_factor_sd, evidence, adopted_by) VALUES ($1, $2, $3, $4, $5, $6)`, [user.plantId, productType, growthFactor, growthFactorSd, JSON.stringify(evidence), user.id]);
    await audit(tx, { plantId: user.plantId, userId: user.id, action: 'adopt-calibration', entity: 'family_setting', entityId: productType, after: { growthFactor, growthFactorSd, evidence } });
  });
  await d.jobs?.projectAll(user.plantId);
}

export { defaultFamilySettings };
