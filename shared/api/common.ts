import { z } from 'zod';

export const idParamSchema = z.object({ id: z.string().uuid('not a valid id') });
export const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use the form YYYY-MM-DD');

export function pageSchema<S extends string>(sortable: readonly [S, ...S[]]) {
  return z.object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
    sort: z.enum(sortable).default(sortable[0]),
    dir: z.enum(['asc', 'desc']).default('asc'),
  });
}

export const pagedSchema = <T extends z.ZodTypeAny>(item: T) =>
  z.object({ items: z.array(item), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
