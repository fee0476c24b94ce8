import { z } from 'zod';
import { latestReadingSchema, pieceStatusSchema } from './pieces';

/** What a yard tablet keeps for offline work: the plant's pieces in the yard and their designs. */
export const yardPieceSchema = z.object({
  id: z.string().uuid(),
  mark: z.string(),
  jobNumber: z.string(),
  designId: z.string().uuid(),
  productType: z.string(),
  bed: z.string().nullable(),
  castDate: z.string(),
  releaseDate: z.string(),
  shipDate: z.string().nullable(),
  bay: z.string().nullable(),
  status: pieceStatusSchema,
  latestReading: latestReadingSchema,
  due: z.boolean(),
  overdue: z.boolean(),
  dueSince: z.string().nullable(),
});
export type YardPiece = z.infer<typeof yardPieceSchema>;

export const yardPackSchema = z.object({
  generatedAt: z.string(),
  today: z.string(),
  timeZone: z.string(),
  unitSystem: z.enum(['us', 'si']),
  pieces: z.array(yardPieceSchema),
  designs: z.array(z.object({ id: z.string().uuid(), code: z.string(), version: z.number().int(), productType: z.string(), spec: z.unknown() })),
});
export type YardPack = z.infer<typeof yardPackSchema>;
