import { z } from 'zod';

/** The one error shape every failing API call returns. */
export const apiErrorSchema = z.object({
  code: z.string(),
  message: z.string(),
  fieldErrors: z.record(z.string(), z.array(z.string())).optional(),
  requestId: z.string().optional(),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

export const ERROR_CODES = {
  validation: 'validation_failed',
  unauthenticated: 'unauthenticated',
  forbidden: 'forbidden',
  notFound: 'not_found',
  conflict: 'conflict',
  csrf: 'csrf_failed',
  rateLimited: 'rate_limited',
  idempotencyMismatch: 'idempotency_key_reused',
  internal: 'internal_error',
  unavailable: 'service_unavailable',
} as const;
