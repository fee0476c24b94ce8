import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildRoutes } from '#server/app';
import type { RouteDef } from '#server/http/route';
import request from 'supertest';
import { sessionHeaders, testApp, type TestApp } from '../helpers/app';
import { buildPlantWithUsers } from '../helpers/factories';

// Every route of the table, fed hostile input by an allowed role: wrong types, huge strings, deep
// nesting, __proto__ keys, NaN, 1e400. Never a 500, never prototype pollution, always the error shape.
let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let routes: RouteDef[];
beforeAll(async () => {
  t = await testApp({ LOGIN_LIMIT: '100000' });
  plant = await buildPlantWithUsers(t.ds);
  routes = buildRoutes(t.deps).filter((r) => !r.path.includes('/imports') || r.method === 'get');
});
afterAll(() => t.close());

const hostile = fc.oneof(
  fc.jsonValue(),
  fc.string({ minLength: 5000, maxLength: 20000 }),
  fc.constantFrom('NaN', '1e400', '-0', '0x10', '__proto__', '{"__proto__":{"polluted":1}}'),
  fc.dictionary(fc.constantFrom('__proto__', 'constructor', 'prototype', 'value', 'pieceId', 'kind', 'mapping', 'spec'), fc.jsonValue()),
  fc.letrec((tie) => ({ node: fc.oneof({ depthSize: 'large' }, fc.constant(null), fc.array(tie('node'), { maxLength: 2 })) })).node,
);

describe('every route under hostile input', () => {
  it('answers with the error shape or success, never a 500, never polluting prototypes', async () => {
    const role = (r: RouteDef): keyof typeof plant.users => (r.roles === 'public' ? 'admin' : (r.roles as Array<keyof typeof plant.users>).find((x) => x !== 'viewer') ?? 'viewer');
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: 10_000 }), hostile, hostile, async (pick, body, q) => {
        const r = routes[pick % routes.length]!;
        const path = `/api${r.path.replace(':id', plant.piece.id).replace(':productType', 'double-tee')}`;
        const query = typeof q === 'object' && q !== null && !Array.isArray(q) ? Object.fromEntries(Object.entries(q).map(([k, v]) => [k, JSON.stringify(v).slice(0, 200)])) : { x: String(q).slice(0, 200) };
        let req = request(t.app)[r.method](path).set(sessionHeaders(t.cfg, plant.users[role(r)].id)).query(query);
        if (r.method !== 'get') req = req.set('Idempotency-Key', `fuzz-${pick}-${Math.random().toString(36).slice(2)}`).set('Content-Type', 'application/json').send(JSON.stringify(body));
        const res = await req;
        if (res.status >= 500) throw new Error(`${r.method} ${r.path} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`);
        if (res.status >= 400) {
          expect(typeof res.body.code, `${r.method} ${r.path}`).toBe('string');
          expect(typeof res.body.message).toBe('string');
        }
        expect(({} as Record<string, unknown>).polluted).toBeUndefined();
        return true;
      }),
      { numRuns: 300 },
    );
  }, 120_000);
});
