import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildPlantWithUsers, PASSWORD } from '../helpers/factories';

// 20 clients post 10,000 readings between them, one in ten sent twice with the same key (a lost answer
// retried): the rows equal the distinct keys, and no request fails on our side.
let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let clients: Session[];
beforeAll(async () => {
  t = await testApp({ LOGIN_LIMIT: '1000' });
  plant = await buildPlantWithUsers(t.ds);
  clients = await Promise.all(Array.from({ length: 20 }, () => signIn(t.app, plant.users.inspector.email, PASSWORD)));
});
afterAll(() => t.close());

describe('concurrent readings with retried keys', () => {
  it('stores exactly one row per key and answers no 5xx', async () => {
    const TOTAL = 10_000;
    const statuses = new Map<number, number>();
    const keys = new Set<string>();
    const base = Date.UTC(2026, 5, 1, 12);
    await Promise.all(
      clients.map(async (c, ci) => {
        for (let i = ci; i < TOTAL; i += clients.length) {
          const key = `load-${plant.piece.id}-${i}`;
          keys.add(key);
          const body = { pieceId: plant.piece.id, value: `${1 + (i % 16) / 16}`, unit: 'in', takenAt: new Date(base + i * 60_000).toISOString(), method: 'level', support: 'dunnage' };
          const times = i % 10 === 0 ? 2 : 1;
          for (let k = 0; k < times; k++) {
            const res = await c.agent.post('/api/readings').set('X-CSRF-Token', c.csrf).set('Idempotency-Key', key).send(body);
            statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
          }
        }
      }),
    );
    expect([...statuses.keys()].filter((s) => s >= 500)).toEqual([]);
    expect(statuses.get(201)).toBe(TOTAL);
    expect(statuses.get(200)).toBe(TOTAL / 10);
    const [{ n }] = await t.ds.query(`SELECT count(*)::int AS n FROM reading WHERE piece_id = $1 AND idempotency_key LIKE 'load-%'`, [plant.piece.id]);
    expect(n).toBe(keys.size);
  }, 300_000);
});
