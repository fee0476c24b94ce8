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
