import { z } from 'zod';
import { checkMember, predictBaseSchema } from '../camber/schema';

/** A design is the engine input without the ages asked for: the piece supplies those. */
export const designSpecSchema = predictBaseSchema.omit({ agesDays: true }).superRefine(checkMember);
export type DesignSpec = z.input<typeof designSpecSchema>;

export const designSummarySchema = z.object({
  id: z.string().uuid(),
  code: z.string(),
  name: z.string(),
  productType: z.string(),
  version: z.number().int(),
  lengthFt: z.number(),
  spec: z.unknown(),
});
export type DesignSummary = z.infer<typeof designSummarySchema>;

export const designInputSchema = z.object({
  code: z.string().trim().min(1, 'give the design a code').max(40),
  name: z.string().trim().min(1, 'give the design a name').max(120),
  spec: designSpecSchema,
});
export type DesignInput = z.input<typeof designInputSchema>;

export const designUpdateSchema = z.object({ name: z.string().trim().min(1).max(120), spec: designSpecSchema });
export const designCopySchema = z.object({ code: z.string().trim().min(1).max(40), name: z.string().trim().min(1).max(120) });
export const reassignSchema = z.object({ pieceIds: z.array(z.string().uuid()).min(1).max(500), designId: z.string().uuid() });

export const designRowSchema = z.object({
  id: z.string().uuid(),
  code: z.string(),
  name: z.string(),
  productType: z.string(),
  version: z.number().int(),
  pieces: z.number().int(),
  spec: z.unknown(),
  createdAt: z.string(),
});
export type DesignRow = z.infer<typeof designRowSchema>;

export const jobInputSchema = z.object({ number: z.string().trim().min(1).max(40), name: z.string().trim().min(1).max(120) });
export const bulkPiecesSchema = z
  .object({
    jobId: z.string().uuid(),
    designId: z.string().uuid(),
    markPattern: z.string().trim().min(1).max(40).refine((p) => p.includes('{n}'), 'put {n} where the number goes, e.g. DT-{n}'),
    start: z.number().int().min(0).max(99999),
    count: z.number().int().min(1).max(500),
    bed: z.string().trim().max(40).optional(),
    castDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use the form YYYY-MM-DD'),
    releaseDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use the form YYYY-MM-DD').optional(),
    shipDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use the form YYYY-MM-DD').optional(),
    erectionDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use the form YYYY-MM-DD').optional(),
    bay: z.string().trim().max(60).optional(),
  })
  .refine((v) => !v.releaseDate || v.releaseDate >= v.castDate, { path: ['releaseDate'], message: 'release cannot come before casting' });
export type BulkPiecesInput = z.input<typeof bulkPiecesSchema>;

/** What a new design starts from: a plain rectangular beam, to be changed to the real member. */
export const STARTER_SPEC: DesignSpec = {
  units: 'us',
  length: 30,
  productType: 'beam',
  section: { shape: 'rectangle', width: 16, height: 24 },
  concrete: { fci: 4, fc: 6, unitWeight: 150, modulus: 'aci318', curing: 'steam', releaseAgeDays: 1 },
  strands: [{ count: 8, area: 0.153, profile: 'straight', eccMid: 8 }],
  prestress: { jackingStress: 202.5 },
  supports: { storage: [{ fromAgeDays: 1, overhang: 1.5 }] },
  method: 'aashto',
};
