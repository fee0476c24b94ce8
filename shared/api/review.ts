import { z } from 'zod';
import { FLAG_KINDS } from '../projection/project';
import { pageSchema, pagedSchema } from './common';
import { pieceStatusSchema } from './pieces';

export const flagSchema = z.object({ kind: z.enum(FLAG_KINDS), severity: z.number().int(), reason: z.string(), raisedAt: z.string() });
export type FlagDto = z.infer<typeof flagSchema>;

export const REVIEW_SORTS = ['urgency', 'mark', 'shipDate'] as const;
export const reviewQuerySchema = pageSchema(REVIEW_SORTS).extend({
  view: z.enum(['needs-decision', 'all-flagged']).default('needs-decision'),
  jobId: z.string().uuid().optional(),
  productType: z.string().max(40).optional(),
  flag: z.enum(FLAG_KINDS).optional(),
  bay: z.string().max(60).optional(),
});
export type ReviewQuery = z.output<typeof reviewQuerySchema>;

const mmRange = z.object({ mm: z.number(), lowMm: z.number(), highMm: z.number() });

export const reviewRowSchema = z.object({
  pieceId: z.string().uuid(),
  mark: z.string(),
  jobNumber: z.string(),
  productType: z.string(),
  bay: z.string().nullable(),
  status: pieceStatusSchema,
  shipDate: z.string().nullable(),
  daysToShip: z.number().int().nullable(),
  flags: z.array(flagSchema),
  latest: z.object({ mm: z.number(), expectedMm: z.number(), lowMm: z.number(), highMm: z.number() }).nullable(),
  atShip: mmRange.nullable(),
  lastDecision: z.object({ kind: z.string(), at: z.string() }).nullable(),
});
export type ReviewRow = z.infer<typeof reviewRowSchema>;
export const reviewPageSchema = pagedSchema(reviewRowSchema);
export type ReviewPage = z.infer<typeof reviewPageSchema>;

export const DECISION_KINDS = ['accept', 'hold', 'engineering', 'remeasure', 'clear'] as const;
export const DECISION_LABELS: Record<(typeof DECISION_KINDS)[number], string> = {
  accept: 'Accept as is',
  hold: 'Hold',
  engineering: 'Send to engineering',
  remeasure: 'Re-measure',
  clear: 'Clear to ship',
};
export const decisionInputSchema = z.object({
  kind: z.enum(DECISION_KINDS),
  comment: z.string().trim().max(2000).default(''),
  /** The piece version the decision was made on; a stale one gets 409 with the current state. */
  version: z.number().int().positive(),
});
export type DecisionInput = z.input<typeof decisionInputSchema>;

export const projectionSchema = z.object({
  computedAt: z.string(),
  method: z.string(),
  readingsUsed: z.number().int(),
  growthFactor: z.number(),
  growthFactorSd: z.number(),
  elasticFactor: z.number(),
  toleranceMm: z.number(),
  differentialMm: z.number(),
  atShip: mmRange.nullable(),
  atErection: mmRange.nullable(),
  note: z.string(),
  curve: z.array(
    z.object({
      ageDays: z.number(),
      camberMm: z.number(),
      lowMm: z.number(),
      highMm: z.number(),
      toleranceLowMm: z.number(),
      toleranceHighMm: z.number(),
      calibratedMm: z.number(),
      calibratedLowMm: z.number(),
      calibratedHighMm: z.number(),
    }),
  ),
});
export const pieceProjectionSchema = z.object({ projection: projectionSchema.nullable(), flags: z.array(flagSchema), failure: z.string().nullable() });
export type PieceProjection = z.infer<typeof pieceProjectionSchema>;
