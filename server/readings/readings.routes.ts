import { CAN } from '#shared/api/roles';
import { createReadingSchema, idempotencyKeySchema, readingSchema } from '#shared/api/readings';
import type { Deps } from '../deps';
import { AppError, fieldErrorsOf } from '../http/errors';
import { defineRoute, type RouteDef } from '../http/route';
import { createReading } from './readings.service';

export function readingRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'post', path: '/readings', summary: 'Log a camber reading (send an Idempotency-Key header)', roles: CAN.logReading,
      body: createReadingSchema, response: readingSchema, raw: true,
      handler: async ({ req, res, user, body }) => {
        const key = idempotencyKeySchema.safeParse(req.get('idempotency-key') ?? '');
        if (!key.success) throw new AppError(400, 'validation_failed', 'the Idempotency-Key header is not valid', fieldErrorsOf(key.error, 'header.Idempotency-Key'));
        const r = await createReading(d, user, key.data, body);
        res.status(r.replayed ? 200 : 201).set('Idempotent-Replayed', String(r.replayed)).json(r.reading);
      },
    }),
  ];
}
