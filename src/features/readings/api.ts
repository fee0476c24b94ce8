import { readingSchema, type CreateReadingInput, type ReadingDto } from '#shared/api/readings';
import { api, upload } from '../../lib/api';

/** Posts a reading; the key makes a retry of the same reading safe. */
export const postReading = (input: CreateReadingInput, idempotencyKey: string): Promise<ReadingDto> =>
  api('/readings', { method: 'POST', body: input, schema: readingSchema, headers: { 'Idempotency-Key': idempotencyKey } });

/** Attaches the photo of a stored reading; a repeat after a lost answer changes nothing. */
export const postPhoto = (readingId: string, photo: Blob): Promise<void> => upload(`/readings/${readingId}/photo`, 'photo', photo, 'reading.jpg');
