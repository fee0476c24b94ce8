import { z } from 'zod';
import { idParamSchema } from '#shared/api/common';
import { bulkPiecesSchema, designCopySchema, designInputSchema, designRowSchema, designUpdateSchema, jobInputSchema, reassignSchema } from '#shared/api/designs';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { addPieces, copyDesign, createDesign, createJob, getDesign, listDesigns, reassignPieces, updateDesign } from './designs.service';

const OFFICE = ['qc_manager', 'engineer', 'admin'] as const;
const ENGINEERS = ['engineer', 'admin'] as const;

export function designRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({ method: 'get', path: '/designs', summary: 'Member designs, every version', roles: OFFICE, response: z.array(designRowSchema), handler: ({ user }) => listDesigns(d, user) }),
    defineRoute({ method: 'get', path: '/designs/:id', summary: 'One design version', roles: OFFICE, resource: 'design', params: idParamSchema, response: designRowSchema, handler: ({ user, params }) => getDesign(d, user, params.id) }),
    defineRoute({ method: 'post', path: '/designs', summary: 'Create a design', roles: ENGINEERS, body: designInputSchema, status: 201, response: designRowSchema, handler: ({ user, body }) => createDesign(d, user, body) }),
    defineRoute({
      method: 'put', path: '/designs/:id', summary: 'Edit a design (a new version when pieces use it)', roles: ENGINEERS, resource: 'design', params: idParamSchema, body: designUpdateSchema, response: designRowSchema,
      handler: ({ user, params, body }) => updateDesign(d, user, params.id, body),
    }),
    defineRoute({
      method: 'post', path: '/designs/:id/copy', summary: 'Copy a design under a new code', roles: ENGINEERS, resource: 'design', params: idParamSchema, body: designCopySchema, status: 201, response: designRowSchema,
      handler: ({ user, params, body }) => copyDesign(d, user, params.id, body.code, body.name),
    }),
    defineRoute({ method: 'post', path: '/pieces/reassign', summary: 'Move pieces to another design version', roles: ENGINEERS, body: reassignSchema, handler: ({ user, body }) => reassignPieces(d, user, body.pieceIds, body.designId) }),
    defineRoute({ method: 'post', path: '/jobs', summary: 'Add a job', roles: ENGINEERS, body: jobInputSchema, status: 201, handler: ({ user, body }) => createJob(d, user, body.number, body.name) }),
    defineRoute({ method: 'post', path: '/pieces/bulk', summary: 'Add pieces by mark pattern and count', roles: ENGINEERS, body: bulkPiecesSchema, status: 201, handler: ({ user, body }) => addPieces(d, user, body) }),
  ];
}
