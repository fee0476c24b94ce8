import { predictInputSchema } from '#shared/camber/schema';
import { predictParsed } from '#shared/camber/predict';
import { CAN } from '#shared/api/roles';
import { defineRoute, type RouteDef } from '../http/route';

export function camberRoutes(): RouteDef[] {
  return [
    defineRoute({
      method: 'post', path: '/camber/predict', summary: 'Predict release camber and its growth with time for a member', roles: CAN.predict, body: predictInputSchema,
      handler: ({ body }) => predictParsed(body),
    }),
  ];
}
