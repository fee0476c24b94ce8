import { CAN } from '#shared/api/roles';
import { yardPackSchema } from '#shared/api/yard';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { yardPack } from './yard.service';

export function yardRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/yard/pack', summary: 'Pieces in the yard with their designs, for offline work on a tablet', roles: CAN.logReading, response: yardPackSchema,
      handler: ({ user }) => yardPack(d, user),
    }),
  ];
}
