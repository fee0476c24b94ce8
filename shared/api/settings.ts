import { z } from 'zod';
import { DEFAULT_READING_AGES } from '../yard/schedule';
import { methodSchema, PRODUCT_TYPES, productTypeSchema, type ProductType } from '../camber/schema';
import { DEFAULT_BAND, DEFAULT_MEASUREMENT_SIGMA_IN, DEFAULT_TOLERANCE_RULES } from '../camber/tolerance';

/** The model and tolerance settings of one product family (product type) at one plant. */
export const familySettingsSchema = z.object({
  /** Overrides the method in the designs of this family; null keeps each design's own. */
  method: methodSchema.nullable(),
  relativeHumidity: z.number().min(20).max(100).nullable(),
  defaultCuring: z.enum(['steam', 'moist']),
  band: z.object({ release: z.number().min(0).max(1), growth: z.number().min(0).max(2), measurementMm: z.number().min(0).max(50) }),
  tolerance: z.object({
    ratePer10ft: z.number().min(0).max(5),
    cap: z.number().min(0).max(10),
    capLong: z.number().min(0).max(10).nullable(),
    longOver: z.number().min(1).max(500).nullable(),
    differentialPer10ft: z.number().min(0).max(5),
    differentialCap: z.number().min(0).max(10),
    source: z.string().trim().min(1).max(300),
    confidence: z.enum(['MEM-M', 'MEM-L', 'plant']),
  }),
  readingAges: z.array(z.number().int().min(1).max(730)).min(1).max(20).refine((a) => a.every((v, i) => i === 0 || v > a[i - 1]!), 'list the ages in increasing order'),
});
export type FamilySettings = z.infer<typeof familySettingsSchema>;

export const settingsListSchema = z.array(z.object({ productType: productTypeSchema, settings: familySettingsSchema, stored: z.boolean(), updatedAt: z.string().nullable() }));

export function defaultFamilySettings(productType: ProductType): FamilySettings {
  const rule = DEFAULT_TOLERANCE_RULES[productType];
  return {
    method: null,
    relativeHumidity: null,
    defaultCuring: 'steam',
    band: { release: DEFAULT_BAND.aashto.release, growth: DEFAULT_BAND.aashto.growth, measurementMm: DEFAULT_MEASUREMENT_SIGMA_IN * 25.4 },
    tolerance: {
      ratePer10ft: rule.ratePer10ft,
      cap: rule.cap,
      capLong: rule.capLong ?? null,
      longOver: rule.longOver ?? null,
      differentialPer10ft: rule.differentialPer10ft,
      differentialCap: rule.differentialCap,
      source: rule.source,
      confidence: rule.confidence,
    },
    readingAges: DEFAULT_READING_AGES,
  };
}

export { PRODUCT_TYPES };

/** Calibration view */
export const calibrationFamilySchema = z.object({
  productType: z.string(),
  pieces: z.number().int(),
  readings: z.number().int(),
  growthFactorMean: z.number().nullable(),
  growthFactorSd: z.number().nullable(),
  interval: z.tuple([z.number(), z.number()]).nullable(),
  byAge: z.array(z.object({ label: z.string(), count: z.number().int(), meanRatio: z.number().nullable(), sdRatio: z.number().nullable() })),
  adopted: z.object({ growthFactor: z.number(), growthFactorSd: z.number(), by: z.string(), at: z.string() }).nullable(),
});
export type CalibrationFamily = z.infer<typeof calibrationFamilySchema>;
export const adoptSchema = z.object({ productType: productTypeSchema, growthFactor: z.number().min(0.2).max(5), growthFactorSd: z.number().min(0.01).max(2) });
