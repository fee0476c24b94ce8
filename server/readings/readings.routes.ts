import multer from 'multer';
import { idParamSchema } from '#shared/api/common';
import { CAN, ROLES } from '#shared/api/roles';
import { createReadingSchema, idempotencyKeySchema, readingSchema } from '#shared/api/readings';
import type { Deps } from '../deps';
import { AppError, fieldErrorsOf } from '../http/errors';
import { defineRoute, type RouteDef } from '../http/route';
import { attachPhoto, PHOTO_MAX_BYTES, readPhoto } from './photos.service';
import { createReading } from './readings.service';

// Multer's defaults have no limits at all: one file, a few fields, 5 MiB.
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 5, parts: 6 } });

export function readingRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'post', path: '/readings/:id/photo', summary: 'Attach the photo of a reading (multipart field "photo"); a repeat changes nothing', roles: CAN.logReading,
      resource: 'reading', params: idParamSchema, raw: true, before: [upload.single('photo')],
      handler: async ({ req, res, user, params }) => {
        const r = await attachPhoto(d, user, params.id, req.file?.buffer);
        res.status(r.created ? 201 : 200).json({ readingId: params.id, stored: true });
      },
    }),
    defineRoute({
      method: 'get', path: '/readings/:id/photo', summary: 'The photo of a reading', roles: ROLES, resource: 'reading', params: idParamSchema, raw: true,
      handler: async ({ res, user, params }) => {
        const p = await readPhoto(d, user, params.id);
        res.set('Content-Type', p.type).set('Cache-Control', 'private, max-age=3600').set('Content-Disposition', 'inline').send(p.bytes);
      },
    }),
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
