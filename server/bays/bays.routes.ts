import { arrangeSchema, bayDetailSchema, bayListSchema, bayQuerySchema, baysListQuerySchema } from '#shared/api/bays';
import { ROLES } from '#shared/api/roles';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { arrangeBay, bayDetail, listBays } from './bays.service';

export function bayRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({ method: 'get', path: '/bays', summary: 'Erection bays', roles: ROLES, query: baysListQuerySchema, response: bayListSchema, handler: ({ user, query }) => listBays(d, user, query.jobId) }),
    defineRoute({
      method: 'get', path: '/bays/detail', summary: 'A bay: current arrangement, pool of interchangeable pieces and the proposal', roles: ROLES, query: bayQuerySchema, response: bayDetailSchema,
      handler: ({ user, query }) => bayDetail(d, user, query.jobId, query.bay),
    }),
    defineRoute({
      method: 'post', path: '/bays/arrange', summary: 'Place pieces in a bay in order (accept a proposal or place by hand)', roles: ['engineer', 'qc_manager', 'admin'], body: arrangeSchema, response: bayDetailSchema,
      handler: ({ user, body }) => arrangeBay(d, user, body),
    }),
  ];
}
