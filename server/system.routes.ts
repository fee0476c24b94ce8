import type { Deps } from './deps';
import { openApiDocument } from './http/openapi';
import { defineRoute, type RouteDef } from './http/route';

export function systemRoutes(d: Deps, table: () => RouteDef[]): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/health', summary: 'Readiness: the database answers', roles: 'public', raw: true,
      handler: async ({ res }) => {
        try {
          await d.ds.query('SELECT 1');
          res.json({ status: 'ok' });
        } catch {
          res.status(503).json({ code: 'service_unavailable', message: 'the database is not reachable' });
        }
      },
    }),
    defineRoute({
      method: 'get', path: '/openapi.json', summary: 'This API as an OpenAPI 3.1 document', roles: 'public',
      handler: () => openApiDocument(table(), '0.1.0'),
    }),
  ];
}
