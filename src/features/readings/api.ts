import { readingSchema, type CreateReadingInput, type ReadingDto } from '#shared/api/readings';
import { api } from '../../lib/api';

/** Posts a reading; the key makes a retry of the same reading safe. */
export const postReading = (input: CreateReadingInput, idempotencyKey: string): Promise<ReadingDto> =>
  api('/readings', { method: 'POST', body: input, schema: readingSchema, headers: { 'Idempotency-Key': idempotencyKey } });
