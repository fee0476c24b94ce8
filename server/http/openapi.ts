import { z } from 'zod';
import type { RouteDef } from './route';

/** OpenAPI 3.1 document generated from the route table and its zod schemas. */
export function openApiDocument(routes: RouteDef[], version: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  const json = (s: z.ZodType): unknown => z.toJSONSchema(s, { io: 'input', unrepresentable: 'any' });
  for (const r of routes) {
    const path = `/api${r.path.replace(/:(\w+)/g, '{$1}')}`;
    const params = [...r.path.matchAll(/:(\w+)/g)].map((m) => ({ name: m[1], in: 'path', required: true, schema: { type: 'string' } }));
    const op: Record<string, unknown> = {
      summary: r.summary,
      'x-roles': r.roles === 'public' ? 'public' : r.roles,
      parameters: params,
      responses: {
        [String(r.status ?? 200)]: { description: 'success', ...(r.response ? { content: { 'application/json': { schema: json(r.response) } } } : {}) },
        default: { description: 'error', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } },
      },
    };
    if (r.query) op['x-query'] = json(r.query);
    if (r.body) op.requestBody = { required: true, content: { 'application/json': { schema: json(r.body) } } };
    (paths[path] ??= {})[r.method] = op;
  }
  return {
    openapi: '3.1.0',
    info: { title: 'Crownwatch API', version, description: 'Camber record and early warning for precast prestressed concrete.' },
    paths,
    components: {
      schemas: {
        Error: { type: 'object', required: ['code', 'message'], properties: { code: { type: 'string' }, message: { type: 'string' }, fieldErrors: { type: 'object', additionalProperties: { type: 'array', items: { type: 'string' } } }, requestId: { type: 'string' } } },
      },
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'cw_session' } },
    },
  };
}
