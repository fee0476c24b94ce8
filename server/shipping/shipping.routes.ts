import { shipSchema, shippingListSchema, shippingQuerySchema } from '#shared/api/bays';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { ship, shippingList } from './shipping.service';

export function shippingRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/shipping', summary: 'Pieces planned to ship on a date, with what blocks them', roles: ['qc_manager', 'engineer', 'admin'], query: shippingQuerySchema, response: shippingListSchema,
      handler: ({ user, query }) => shippingList(d, user, query.date),
    }),
    defineRoute({
      method: 'post', path: '/shipping/ship', summary: 'Mark pieces shipped (blocked pieces need a QC manager override with a comment)', roles: ['qc_manager', 'admin'], body: shipSchema,
      handler: ({ user, body }) => ship(d, user, body),
    }),
  ];
}
