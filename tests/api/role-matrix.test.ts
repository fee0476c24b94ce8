import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildRoutes } from '#server/app';
import type { RouteDef } from '#server/http/route';
import { ROLES, type Role } from '#shared/api/roles';
import { DEMO_DESIGNS } from '#seed/designs';
import { sessionHeaders, testApp, type TestApp } from '../helpers/app';
import { buildPlantWithUsers } from '../helpers/factories';

// Generated from the route table itself: a route added to the API is in this matrix without anyone
// remembering to add it. Expectations: anonymous → 401 (unless public); a role the route does not list
// → 403; a listed role → neither 401 nor 403; a listed role of another plant, pointing at this plant's
// record → 404.

let t: TestApp;
let a: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let b: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let routes: RouteDef[];
const imports = new Map<string, string>();
const designs = new Map<string, string>();

/** Valid bodies for routes that name a record, so the plant check is reached after validation. */
const VALID_BODY: Record<string, unknown> = {
  'patch /users/:id': { role: 'inspector' },
  'post /pieces/:id/decisions': { kind: 'remeasure', comment: '', version: 1 },
  'post /imports/:id/preview': { mapping: {} },
  'post /imports/:id/commit': { mapping: {} },
  'put /designs/:id': { name: 'x', spec: DEMO_DESIGNS[0]!.spec },
  'post /designs/:id/copy': { code: 'COPY-1', name: 'copy' },
};

beforeAll(async () => {
  t = await testApp({ LOGIN_LIMIT: '1000' });
  a = await buildPlantWithUsers(t.ds);
  b = await buildPlantWithUsers(t.ds);
  routes = buildRoutes(t.deps);
  for (const p of [a, b]) {
    const [row] = await t.ds.query(
      `INSERT INTO csv_import (plant_id, kind, file_hash, filename, size, content, delimiter, header, created_by) VALUES ($1, 'readings', $2, 'x.csv', 1, 'mark\nX', ',', '["mark"]', $3) RETURNING id`,
      [p.plantId, `hash-${p.plantId}`, p.users.engineer.id],
    );
    imports.set(p.plantId, row.id);
    designs.set(p.plantId, (await t.ds.query(`SELECT design_id FROM piece WHERE id = $1`, [p.piece.id]))[0].design_id);
  }
});
afterAll(() => t.close());

const idFor = (r: RouteDef, plant: typeof a): string => {
  switch (r.resource) {
    case 'user':
      return plant.users.inspector.id;
    case 'piece':
    case undefined:
      return plant.piece.id;
    case 'reading':
      return plant.reading.id;
    case 'import':
      return imports.get(plant.plantId)!;
    case 'design':
      return designs.get(plant.plantId)!;
    default:
      throw new Error(`add an id for resource ${r.resource}`);
  }
};

function call(r: RouteDef, headers: Record<string, string>, plant: typeof a) {
  const path = `/api${r.path.replace(':id', idFor(r, plant))}`;
  const req = request(t.app)[r.method](path).set(headers);
  return r.method === 'get' ? req : req.send((VALID_BODY[`${r.method} ${r.path}`] as object) ?? {});
}

describe('role × route matrix', () => {
  it('covers every route of the table', () => {
    expect(routes.length).toBeGreaterThan(10);
  });

  it('anonymous callers get 401 on every route that is not public', async () => {
    for (const r of routes) {
      const res = await call(r, {}, a);
      if (r.roles === 'public') expect([401, 403], `${r.method} ${r.path}`).not.toContain(res.status);
      else expect(res.status, `${r.method} ${r.path}`).toBe(401);
      expect(res.body.code ?? 'ok', `${r.method} ${r.path} error shape`).toBeTypeOf('string');
    }
  });

  it('each role gets 403 where the route does not list it, and passes the role check where it does', async () => {
    for (const r of routes) {
      for (const role of ROLES) {
        const res = await call(r, sessionHeaders(t.cfg, a.users[role].id), a);
        const allowed = r.roles === 'public' || (r.roles as readonly Role[]).includes(role);
        // The plant's record is never kept by a browser or proxy (server/app.ts).
        expect([res.headers['cache-control'], res.headers.etag], `${role} ${r.method} ${r.path} caching`).toEqual(['no-store', undefined]);
        if (allowed) expect([401, 403], `${role} ${r.method} ${r.path} → ${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status);
        else {
          expect(res.status, `${role} ${r.method} ${r.path}`).toBe(403);
          expect(res.body.code).toBe('forbidden');
        }
      }
    }
  });

  it("a user of another plant gets 404 for this plant's records, whatever the route", async () => {
    const named = routes.filter((r) => r.path.includes(':id'));
    expect(named.length).toBeGreaterThan(0);
    for (const r of named) {
      if (r.body && !VALID_BODY[`${r.method} ${r.path}`]) throw new Error(`add a valid body for ${r.method} ${r.path} to VALID_BODY`);
      const role = (r.roles as readonly Role[]).find((x) => x !== 'viewer') ?? 'viewer';
      const res = await call(r, sessionHeaders(t.cfg, b.users[role].id), a);
      expect(res.status, `${role} of plant B ${r.method} ${r.path}`).toBe(404);
      expect(res.body.code).toBe('not_found');
    }
  });
});
