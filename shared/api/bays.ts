import { z } from 'zod';
import { pieceStatusSchema } from './pieces';

export const bayCandidateSchema = z.object({
  id: z.string().uuid(),
  mark: z.string(),
  status: pieceStatusSchema,
  position: z.number().int().nullable(),
  inBay: z.boolean(),
  camberMm: z.number(),
  sigmaMm: z.number(),
  ageDays: z.number(),
  committed: z.boolean(),
});
export type BayCandidateDto = z.infer<typeof bayCandidateSchema>;

export const bayDetailSchema = z.object({
  jobId: z.string().uuid(),
  jobNumber: z.string(),
  bay: z.string(),
  positions: z.number().int(),
  toleranceMm: z.number(),
  current: z.array(bayCandidateSchema),
  currentDifferencesMm: z.array(z.number()),
  pool: z.array(bayCandidateSchema),
  withoutProjection: z.array(z.string()),
  proposal: z.object({ feasible: z.boolean(), order: z.array(z.string().uuid()), worstMm: z.number(), marginMm: z.number(), differencesMm: z.array(z.number()), reason: z.string().nullable() }),
});
export type BayDetail = z.infer<typeof bayDetailSchema>;

export const bayQuerySchema = z.object({ jobId: z.string().uuid(), bay: z.string().trim().min(1).max(60) });
export const baysListQuerySchema = z.object({ jobId: z.string().uuid().optional() });
export const bayListSchema = z.array(z.object({ jobId: z.string().uuid(), jobNumber: z.string(), bay: z.string(), pieces: z.number().int() }));

export const arrangeSchema = bayQuerySchema.extend({ pieceIds: z.array(z.string().uuid()).min(1).max(60) }).refine((v) => new Set(v.pieceIds).size === v.pieceIds.length, { path: ['pieceIds'], message: 'a piece can stand in one position only' });
export type ArrangeInput = z.infer<typeof arrangeSchema>;

/** Shipping */
export const shippingQuerySchema = z.object({ date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use the form YYYY-MM-DD') });
export const shippingRowSchema = z.object({
  pieceId: z.string().uuid(),
  mark: z.string(),
  jobNumber: z.string(),
  bay: z.string().nullable(),
  position: z.number().int().nullable(),
  status: pieceStatusSchema,
  lastDecision: z.object({ kind: z.string(), at: z.string(), by: z.string() }).nullable(),
  flags: z.array(z.string()),
  latestReading: z.object({ mm: z.number(), takenAt: z.string(), ageDays: z.number().int() }).nullable(),
  atErection: z.object({ mm: z.number(), lowMm: z.number(), highMm: z.number() }).nullable(),
  blockers: z.array(z.string()),
});
export type ShippingRow = z.infer<typeof shippingRowSchema>;
export const shippingListSchema = z.object({ date: z.string(), readingMaxAgeDays: z.number().int(), rows: z.array(shippingRowSchema) });
export const shipSchema = z.object({
  pieceIds: z.array(z.string().uuid()).min(1).max(200),
  overrideComment: z.string().trim().max(2000).optional(),
});
export type ShipInput = z.infer<typeof shipSchema>;
