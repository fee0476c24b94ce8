import { boardSchema, jobsStatusSchema } from '#shared/api/board';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { board, jobsStatus } from './board.service';

export function boardRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({ method: 'get', path: '/board', summary: "The yard board: counts, this week's shipping, today's readings", roles: ['qc_manager', 'engineer', 'admin'], response: boardSchema, handler: ({ user }) => board(d, user) }),
    defineRoute({ method: 'get', path: '/jobs/status', summary: 'Projection queue and failures', roles: ['admin', 'engineer'], response: jobsStatusSchema, handler: ({ user }) => jobsStatus(d, user) }),
  ];
}
