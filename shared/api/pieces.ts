import { z } from 'zod';
import { pageSchema, pagedSchema } from './common';

export const PIECE_STATUSES = ['cast', 'in_storage', 'hold', 'engineering', 'cleared', 'shipped'] as const;
export const pieceStatusSchema = z.enum(PIECE_STATUSES);
export type PieceStatus = z.infer<typeof pieceStatusSchema>;
export const PIECE_STATUS_LABELS: Record<PieceStatus, string> = {
  cast: 'Cast, not released',
  in_storage: 'In storage',
  hold: 'On hold',
  engineering: 'In engineering review',
  cleared: 'Cleared to ship',
  shipped: 'Shipped',
};

export const PIECE_SORTS = ['mark', 'castDate', 'shipDate', 'status', 'job'] as const;
export const pieceListQuerySchema = pageSchema(PIECE_SORTS).extend({
  q: z.string().trim().max(60).optional(),
  status: pieceStatusSchema.optional(),
  productType: z.string().max(40).optional(),
  jobId: z.string().uuid().optional(),
});
export type PieceListQuery = z.output<typeof pieceListQuerySchema>;

export const latestReadingSchema = z.object({ valueMm: z.number(), takenAt: z.string() }).nullable();

export const pieceRowSchema = z.object({
  id: z.string().uuid(),
  mark: z.string(),
  jobId: z.string().uuid(),
  jobNumber: z.string(),
  designId: z.string().uuid(),
  designCode: z.string(),
  productType: z.string(),
  bed: z.string().nullable(),
  castDate: z.string(),
  releaseDate: z.string(),
  shipDate: z.string().nullable(),
  erectionDate: z.string().nullable(),
  bay: z.string().nullable(),
  bayPosition: z.number().int().nullable(),
  status: pieceStatusSchema,
  latestReading: latestReadingSchema,
});
export type PieceRow = z.infer<typeof pieceRowSchema>;
export const piecePageSchema = pagedSchema(pieceRowSchema);
export type PiecePage = z.infer<typeof piecePageSchema>;

export const jobSchema = z.object({ id: z.string().uuid(), number: z.string(), name: z.string() });
export type JobRow = z.infer<typeof jobSchema>;
