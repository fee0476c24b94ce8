import { z } from 'zod';
import { idParamSchema } from '#shared/api/common';
import { pieceDetailSchema } from '#shared/api/piece-detail';
import { jobSchema, pieceListQuerySchema, piecePageSchema } from '#shared/api/pieces';
import { ROLES } from '#shared/api/roles';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { listPieces } from './pieces.repository';
import { listJobs, pieceDetail } from './pieces.service';

export function pieceRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/pieces', summary: 'Pieces: search by mark, filter, sort, page', roles: ROLES, query: pieceListQuerySchema, response: piecePageSchema,
      handler: ({ user, query }) => listPieces(d.ds, user, query),
    }),
    defineRoute({
      method: 'get', path: '/pieces/:id', summary: 'One piece with its design, readings and decisions', roles: ROLES, resource: 'piece', params: idParamSchema, response: pieceDetailSchema,
      handler: ({ user, params }) => pieceDetail(d, user, params.id),
    }),
    defineRoute({
      method: 'get', path: '/jobs', summary: "The plant's jobs", roles: ROLES, response: z.array(jobSchema),
      handler: ({ user }) => listJobs(d, user),
    }),
  ];
}
