import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDataSource, MIGRATIONS } from '#server/db/data-source';
import { migrate, revertLast } from '#server/ops/database';
import pino from 'pino';
import { seedDemo, isDriftingIndex } from '#seed/demo';
import { loadConfig } from '#server/config';
import { createMailer } from '#server/mail/mailer';
import { recomputeAll } from '#server/projections/projection.service';
import { curvePoints } from '#server/projections/stored-result';
import { reviewList } from '#server/review/review.repository';
import { loadSessionUser } from '#server/users/users.repository';

// Runs against a fresh, empty database made for this file and dropped afterwards.
const adminUrl = (): string => {
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = '/postgres';
  return u.toString();
};
const name = `cw_fresh_${randomUUID().slice(0, 8)}`;
const url = (() => {
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${name}`;
  return u.toString();
})();

async function admin(sql: string): Promise<void> {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  await c.query(sql);
  await c.end();
}

beforeAll(() => admin(`CREATE DATABASE ${name}`));
afterAll(() => admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`));

const tables = async (): Promise<string[]> => {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const r = await c.query(`SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_name <> 'migrations' ORDER BY 1`);
  await c.end();
  return r.rows.map((x) => x.table_name as string);
};

describe('migrations and the demo scenario on an empty database', () => {
  it('when migrated up, down and up again, then the schema comes and goes cleanly', async () => {
    const all = MIGRATIONS.map((M) => new M().name);
    expect(await migrate(url)).toEqual(all);
    expect(await tables()).toEqual(expect.arrayContaining(['app_user', 'audit_event', 'auth_token', 'decision', 'job', 'member_design', 'piece', 'plant', 'reading', 'reading_photo']));
    for (let i = 0; i < all.length; i++) await revertLast(url);
    expect(await tables()).toEqual([]);
    expect(await migrate(url)).toEqual(all);
    expect(await migrate(url)).toEqual([]);
  });
  it('when the demo scenario is loaded twice, then the second run adds nothing', async () => {
    const ds = createDataSource(url, 2);
    await ds.initialize();
    try {
      const counts = async (): Promise<Record<string, number>> => {
        const out: Record<string, number> = {};
        for (const t of ['plant', 'job', 'app_user', 'member_design', 'piece', 'reading']) out[t] = Number((await ds.query(`SELECT count(*) FROM ${t}`))[0].count);
        return out;
      };
      const now = new Date('2026-12-01T12:00:00Z');
      expect((await seedDemo(ds, { now, bcryptCost: 10 })).created).toBe(true);
      const first = await counts();
      expect(first.piece).toBe(150);
      expect(first.app_user).toBe(5);
      expect(first.reading).toBeGreaterThan(400);
      expect((await seedDemo(ds, { now, bcryptCost: 10 })).created).toBe(false);
      expect(await counts()).toEqual(first);

      // The review list of the demo shows exactly the drifting pieces still in the yard.
      const cfg = loadConfig({ ...process.env, DATABASE_URL: url });
      const deps = { ds, cfg, mailer: createMailer(cfg), log: pino({ level: 'silent' }) };
      await recomputeAll(deps, { quiet: true });
      const [qc] = await ds.query(`SELECT id FROM app_user WHERE role = 'qc_manager'`);
      const user = (await loadSessionUser(ds, qc.id))!;
      const list = (await reviewList(ds, user, { view: 'needs-decision', sort: 'mark', dir: 'asc', page: 1, pageSize: 200 })).value();
      const pieces: Array<{ mark: string; status: string }> = await ds.query(`SELECT mark, status FROM piece ORDER BY created_at`);
      const drifting = pieces.filter((p, i) => isDriftingIndex(i) && p.status !== 'shipped').map((p) => p.mark).sort();
      expect(drifting.length).toBeGreaterThan(0);
      expect(list.items.map((i) => i.mark).sort()).toEqual(drifting);
    } finally {
      await ds.destroy();
    }
  });
  it('when the binary curve migration is reverted and applied again, then every stored curve reads the same points and bytes', async () => {
    // Runs on the projections the previous test stored (the demo, recomputed).
    const ds = createDataSource(url, 2);
    await ds.initialize();
    try {
      const stored: Array<{ piece_id: string; curve: Buffer }> = await ds.query(`SELECT piece_id, curve FROM projection ORDER BY piece_id`);
      expect(stored.length).toBeGreaterThan(50);
      expect(stored.every((r) => r.curve.length > 0 && r.curve.length % 36 === 0)).toBe(true);
      const all = MIGRATIONS.map((M) => new M().name);
      const back = all.length - all.indexOf('ProjectionCurveBinary1797379200000');
      for (let i = 0; i < back; i++) await revertLast(url);
      const asJson: Array<{ piece_id: string; curve: unknown }> = await ds.query(`SELECT piece_id, curve FROM projection ORDER BY piece_id`);
      expect(asJson.map((r) => r.curve)).toEqual(stored.map((r) => curvePoints(r.curve)));
      await migrate(url);
      const again: Array<{ piece_id: string; curve: Buffer }> = await ds.query(`SELECT piece_id, curve FROM projection ORDER BY piece_id`);
      expect(again).toEqual(stored);
    } finally {
      await ds.destroy();
    }
  });
});
