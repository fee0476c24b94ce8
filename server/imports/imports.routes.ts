import multer from 'multer';
import { z } from 'zod';
import { idParamSchema } from '#shared/api/common';
import { commitSchema, importSummarySchema, previewResultSchema, previewSchema, uploadFieldsSchema } from '#shared/api/imports';
import type { Deps } from '../deps';
import { AppError, fieldErrorsOf } from '../http/errors';
import { defineRoute, type RouteDef } from '../http/route';
import { commitImport, listImports, previewImport, rejectedCsv, uploadCsv } from './imports.service';

// One file of at most 20 MB (about 400,000 reading rows), and the two form fields.
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: 20 * 1024 * 1024, files: 1, fields: 4, parts: 6 } });
const ENGINEERS = ['engineer', 'admin'] as const;

export function importRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'post', path: '/imports', summary: 'Upload a readings or piece-schedule CSV (multipart: file, kind, delimiter)', roles: ENGINEERS, raw: true, before: [upload.single('file')],
      handler: async ({ req, res, user }) => {
        const fields = uploadFieldsSchema.safeParse(req.body ?? {});
        if (!fields.success) throw new AppError(400, 'validation_failed', 'some form fields are not valid', fieldErrorsOf(fields.error));
        const r = await uploadCsv(d, user, req.file, fields.data.kind, fields.data.delimiter);
        res.status(r.created ? 201 : 200).json(r.summary);
      },
    }),
    defineRoute({ method: 'get', path: '/imports', summary: 'Recent imports', roles: ENGINEERS, response: z.array(importSummarySchema), handler: ({ user }) => listImports(d, user) }),
    defineRoute({
      method: 'post', path: '/imports/:id/preview', summary: 'The rows as understood with this mapping, and every error', roles: ENGINEERS, resource: 'import', params: idParamSchema, body: previewSchema, response: previewResultSchema,
      handler: ({ user, params, body }) => previewImport(d, user, params.id, body.mapping, body.saveMappingAs),
    }),
    defineRoute({
      method: 'post', path: '/imports/:id/commit', summary: 'Commit the import in one transaction (a repeat returns the first result)', roles: ENGINEERS, resource: 'import', params: idParamSchema, body: commitSchema, response: importSummarySchema,
      handler: ({ user, params, body }) => commitImport(d, user, params.id, body.mapping, body.allOrNothing, body.saveMappingAs),
    }),
    defineRoute({
      method: 'get', path: '/imports/:id/refused.csv', summary: 'The refused rows with an error column', roles: ENGINEERS, resource: 'import', params: idParamSchema, raw: true,
      handler: async ({ res, user, params }) => {
        const f = await rejectedCsv(d, user, params.id);
        res.set('Content-Type', 'text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="${f.name}"`).set('Cache-Control', 'no-store').send(f.csv);
      },
    }),
  ];
}
