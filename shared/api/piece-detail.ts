import { z } from 'zod';
import { pieceRowSchema } from './pieces';
import { readingSchema } from './readings';

export const decisionSchema = z.object({ id: z.string().uuid(), kind: z.string(), comment: z.string(), decidedBy: z.string(), decidedAt: z.string() });

export const pieceDetailSchema = z.object({
  piece: pieceRowSchema.extend({ version: z.number().int() }),
  design: z.object({ id: z.string().uuid(), code: z.string(), name: z.string(), version: z.number().int(), productType: z.string(), spec: z.unknown() }),
  readings: z.array(readingSchema),
  decisions: z.array(decisionSchema),
});
export type PieceDetail = z.infer<typeof pieceDetailSchema>;
