import { idParamSchema } from '#shared/api/common';
import { decisionInputSchema, pieceProjectionSchema, reviewPageSchema, reviewQuerySchema } from '#shared/api/review';
import { ROLES } from '#shared/api/roles';
import { decide } from '../decisions/decisions.service';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { pieceProjection } from '../projections/projection.query';
import { reviewList } from './review.repository';

const QC = ['qc_manager', 'engineer', 'admin'] as const;

export function reviewRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/review', summary: 'Flagged pieces ordered by urgency (ship date, severity)', roles: QC, query: reviewQuerySchema, response: reviewPageSchema,
      handler: ({ user, query }) => reviewList(d.ds, user, query),
    }),
    defineRoute({
      method: 'get', path: '/pieces/:id/projection', summary: 'The stored projection of a piece with its flags', roles: ROLES, resource: 'piece', params: idParamSchema, response: pieceProjectionSchema,
      handler: ({ user, params }) => pieceProjection(d, user, params.id),
    }),
    defineRoute({
      method: 'post', path: '/pieces/:id/decisions', summary: 'Record a QC decision (append-only)', roles: QC, resource: 'piece', params: idParamSchema, body: decisionInputSchema, status: 201,
      handler: ({ user, params, body }) => decide(d, user, params.id, body),
    }),
  ];
}
