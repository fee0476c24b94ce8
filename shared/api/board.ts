import { z } from 'zod';
import { FLAG_KINDS } from '../projection/project';
import { pieceStatusSchema } from './pieces';

export const boardSchema = z.object({
  today: z.string(),
  byStatus: z.array(z.object({ status: pieceStatusSchema, count: z.number().int() })),
  byFlag: z.array(z.object({ kind: z.enum(FLAG_KINDS), count: z.number().int() })),
  readingsToday: z.number().int(),
  shippingThisWeek: z.array(
    z.object({ pieceId: z.string().uuid(), mark: z.string(), jobNumber: z.string(), shipDate: z.string(), status: pieceStatusSchema, flags: z.number().int(), decided: z.boolean() }),
  ),
  /** Latest trustworthy reading ÷ prediction, one value per piece with readings. */
  ratios: z.array(z.number()),
});
export type Board = z.infer<typeof boardSchema>;

export const jobsStatusSchema = z.object({
  queues: z.array(z.object({ name: z.string(), state: z.string(), count: z.number().int() })),
  failures: z.array(z.object({ pieceId: z.string().uuid(), mark: z.string(), failedAt: z.string(), message: z.string() })),
  lastNightly: z.string().nullable(),
});
export type JobsStatus = z.infer<typeof jobsStatusSchema>;
