import type { DataSource, EntityManager } from 'typeorm';
import { defaultFamilySettings, familySettingsSchema, type FamilySettings } from '#shared/api/settings';
import { PRODUCT_TYPES, type ProductType } from '#shared/camber/schema';

/** The settings of one family at a plant: stored ones, or the defaults of the engineering reference. */
export async function familySettings(db: DataSource | EntityManager, plantId: string, productType: string): Promise<FamilySettings> {
  const rows: Array<{ settings: unknown }> = await db.query(`SELECT settings FROM family_setting WHERE plant_id = $1 AND product_type = $2`, [plantId, productType]);
  const known = (PRODUCT_TYPES as readonly string[]).includes(productType) ? (productType as ProductType) : 'double-tee';
  const stored = rows[0] ? familySettingsSchema.safeParse(rows[0].settings) : null;
  return stored?.success ? stored.data : defaultFamilySettings(known);
}

/** The growth factor adopted for a family, as the prior of its pieces' calibration. */
export async function adoptedFactor(db: DataSource | EntityManager, plantId: string, productType: string): Promise<{ mean: number; sd: number } | null> {
  const rows: Array<{ growth_factor: string; growth_factor_sd: string }> = await db.query(
    `SELECT growth_factor, growth_factor_sd FROM calibration_adoption WHERE plant_id = $1 AND product_type = $2 ORDER BY adopted_at DESC LIMIT 1`,
    [plantId, productType],
  );
  return rows[0] ? { mean: Number(rows[0].growth_factor), sd: Number(rows[0].growth_factor_sd) } : null;
}
