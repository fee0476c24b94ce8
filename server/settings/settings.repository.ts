import type { DataSource, EntityManager } from 'typeorm';
import { defaultFamilySettings, familySettingsSchema, type FamilySettings } from '#shared/api/settings';
import { PRODUCT_TYPES, type ProductType } from '#shared/camber/schema';

/** The settings of one family at a plant: stored ones, or the defaults of the engineering reference. */
export async function familySettings(db: DataSource | EntityManager, plantId: string, productType: string): Promise<FamilySettings> {
  const rows: Array<{ settings: unknown }> = await db.query(`SELECT settings FROM family_setting WHERE plant_id = $1 AND product_type = $2`, [plantId, productType]);
  return settingsOrDefaults(productType, rows[0]?.settings);
}

function settingsOrDefaults(productType: string, stored: unknown): FamilySettings {
  const known = (PRODUCT_TYPES as readonly string[]).includes(productType) ? (productType as ProductType) : 'double-tee';
  const parsed = stored === undefined || stored === null ? null : familySettingsSchema.safeParse(stored);
  return parsed?.success ? parsed.data : defaultFamilySettings(known);
}

export interface FamilyForProjection { settings: FamilySettings; adopted: { mean: number; sd: number } | null }

/**
 * The settings and adopted growth factor of several families at once, keyed `plantId|productType`: one
 * query for a projection batch whatever the number of families in it.
 */
export async function familiesForProjection(db: DataSource | EntityManager, families: Array<{ plantId: string; productType: string }>): Promise<Map<string, FamilyForProjection>> {
  const rows: Array<{ plant_id: string; product_type: string; settings: unknown; growth_factor: number | null; growth_factor_sd: number | null }> = await db.query(
    `SELECT f.plant_id, f.product_type, s.settings, a.growth_factor::float8 AS growth_factor, a.growth_factor_sd::float8 AS growth_factor_sd
       FROM unnest($1::uuid[], $2::text[]) AS f(plant_id, product_type)
       LEFT JOIN family_setting s ON s.plant_id = f.plant_id AND s.product_type = f.product_type
       LEFT JOIN LATERAL (SELECT c.growth_factor, c.growth_factor_sd FROM calibration_adoption c
                           WHERE c.plant_id = f.plant_id AND c.product_type = f.product_type ORDER BY c.adopted_at DESC LIMIT 1) a ON true`,
    [families.map((f) => f.plantId), families.map((f) => f.productType)],
  );
  return new Map(rows.map((r) => [`${r.plant_id}|${r.product_type}`, {
    settings: settingsOrDefaults(r.product_type, r.settings),
    adopted: r.growth_factor === null ? null : { mean: r.growth_factor, sd: Number(r.growth_factor_sd) },
  }]));
}
