import { MailDev } from 'maildev';
import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import type { Deps } from '#server/deps';
import { createJobs, QUEUES, type JobRunner } from '#server/jobs/queue';
import { createMailer } from '#server/mail/mailer';
import { loadConfig } from '#server/config';
import { signIn, testApp, type TestApp } from '../helpers/app';
import { buildDesign, buildJob, buildPiece, buildPlantWithUsers, buildReading, PASSWORD } from '../helpers/factories';
import { mailsTo } from '../helpers/inbox';

let t: TestApp;
let jobs: JobRunner;
beforeAll(async () => {
  t = await testApp({ ALERT_DIGEST_SECONDS: '0', PROJECTION_DELAY_SECONDS: '0' });
  jobs = await createJobs(t.deps, { schedule: false });
});
afterAll(async () => {
  await jobs.stop();
  await t.close();
});

const until = async <T>(fn: () => Promise<T>, ok: (v: T) => boolean, ms = 20_000): Promise<T> => {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (ok(v) || Date.now() > end) return v;
    await new Promise((r) => setTimeout(r, 250));
  }
};
const jobsOf = async (pieceId: string): Promise<Array<{ state: string }>> =>
  t.ds.query(`SELECT state::text AS state FROM pgboss.job WHERE name = $1 AND data->>'pieceId' = $2`, [QUEUES.projection, pieceId]);

describe('projection queue (pg-boss in PostgreSQL)', () => {
  it('when ten readings of one piece arrive in a burst, then one projection run is queued', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const app = createApp({ ...t.deps, jobs }, null);
    const s = await signIn(app, plant.users.inspector.email, PASSWORD);
    for (let i = 0; i < 10; i++) {
      const res = await s.agent
        .post('/api/readings')
        .set('X-CSRF-Token', s.csrf)
        .set('Idempotency-Key', `burst-${plant.piece.id}-${i}`)
        .send({ pieceId: plant.piece.id, value: `1 ${i % 8}/8`.replace(' 0/8', ''), unit: 'in', takenAt: new Date().toISOString(), method: 'level', support: 'dunnage' });
      expect(res.status).toBe(201);
    }
    expect(await jobsOf(plant.piece.id)).toEqual([{ state: 'created' }]);
  });

  it('when the handler fails twice and then succeeds, then the job completes and one result is stored', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const piece = plant.piece;
    // Break the design so the engine refuses it, then mend it after the second failure.
    const [{ design_id: designId }] = await t.ds.query(`SELECT design_id FROM piece WHERE id = $1`, [piece.id]);
    const [{ spec }] = await t.ds.query(`SELECT spec FROM member_design WHERE id = $1`, [designId]);
    await t.ds.query(`UPDATE member_design SET spec = spec || '{"length": -1}' WHERE id = $1`, [designId]);
    await jobs.boss.send(QUEUES.projection, { pieceId: piece.id }, { singletonKey: piece.id, retryLimit: 3, retryDelay: 1, retryBackoff: false });
    let failures = 0;
    await jobs.boss.work<{ pieceId: string }>(QUEUES.projection, { pollingIntervalSeconds: 1 }, async ([job]) => {
      const { runProjection } = await import('#server/projections/projection.service');
      try {
        await runProjection(t.deps, job!.data.pieceId);
      } catch (e) {
        failures++;
        if (failures === 2) await t.ds.query(`UPDATE member_design SET spec = $2 WHERE id = $1`, [designId, JSON.stringify(spec)]);
        throw e;
      }
    });
    const states = await until(() => jobsOf(piece.id), (v) => v.some((j) => j.state === 'completed'));
    await jobs.boss.offWork(QUEUES.projection);
    expect(states).toEqual([{ state: 'completed' }]);
    expect(failures).toBe(2);
    expect(await t.ds.query(`SELECT count(*)::int AS n FROM projection WHERE piece_id = $1`, [piece.id])).toEqual([{ n: 1 }]);
    expect(await t.ds.query(`SELECT count(*)::int AS n FROM projection_failure WHERE piece_id = $1`, [piece.id])).toEqual([{ n: 0 }]);
  });

  it('when the nightly run goes, then every active piece of the plant has a projection as of that night', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const extra = [await buildPiece(t.ds, plant.plantId), await buildPiece(t.ds, plant.plantId), await buildPiece(t.ds, plant.plantId, { status: 'shipped' })];
    const night = new Date(Date.now() + 2 * 86_400_000); // a run named for a later night (the batches may run late or be retried)
    await jobs.startWorkers();
    const queued = await jobs.projectAll(plant.plantId, night);
    expect(queued).toBe(3); // the shipped piece is not active
    const asOf = await until(
      () => t.ds.query(`SELECT count(*)::int AS n FROM projection WHERE plant_id = $1 AND computed_at = $2`, [plant.plantId, night]),
      (v) => v[0].n === 3,
    );
    expect(asOf).toEqual([{ n: 3 }]);
    expect(extra).toHaveLength(3);
  });

  it('when a batch of the night runs late, then every bay is checked once, after it, from the night\'s results', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const job = await buildJob(t.ds, plant.plantId);
    const design = await buildDesign(t.ds, plant.plantId);
    const bay = await Promise.all([1, 2, 3].map(async (position) => {
      const p = await buildPiece(t.ds, plant.plantId, { jobId: job.id, designId: design.id, castDate: '2026-10-01' });
      await t.ds.query(`UPDATE piece SET bay = 'Bay 1', bay_position = $2, erection_date = ship_date + 2 WHERE id = $1`, [p.id, position]);
      // The middle piece reads twice its neighbours' camber: projected far apart at erection.
      await buildReading(t.ds, plant.plantId, p.id, plant.users.inspector.id, { valueMm: position === 2 ? 60 : 30, takenAt: '2026-10-20T15:00:00.000Z' });
      return p;
    }));
    const night = new Date(Date.now() + 3 * 86_400_000);
    await jobs.startWorkers();
    // A batch of the night holding the bay's pieces, retried a few seconds late.
    const late = await jobs.boss.send(QUEUES.nightlyBatch, { pieceIds: bay.map((p) => p.id), asOf: night.toISOString() }, { startAfter: 4 });
    await jobs.projectAll(plant.plantId, night);
    const state = async (id: string | null, name: string): Promise<{ state: string; completed_on: Date | null }> =>
      (await t.ds.query(`SELECT state::text AS state, completed_on FROM pgboss.job WHERE id = $1 AND name = $2`, [id, name]))[0];
    // The check's job that checked the bays (the others found batches left and looked again later).
    const checked = await until(
      () => t.ds.query(`SELECT id FROM pgboss.job WHERE name = $1 AND singleton_key = $2 AND state = 'completed' AND output ? 'raised'`, [QUEUES.nightlyBays, plant.plantId]),
      (v) => v.length > 0,
    );
    expect(checked).toHaveLength(1);
    const check = checked[0].id as string;
    const [lateDone, checkDone] = [await state(late, QUEUES.nightlyBatch), await state(check, QUEUES.nightlyBays)];
    expect([lateDone.state, checkDone.state]).toEqual(['completed', 'completed']);
    expect(+checkDone.completed_on!).toBeGreaterThanOrEqual(+lateDone.completed_on!);
    // Raised once on the odd one out, never on its neighbours; no flag raised and cleared on the way.
    const mismatches = await t.ds.query(
      `SELECT piece_id, cleared_at IS NULL AS active FROM piece_flag WHERE piece_id = ANY($1::uuid[]) AND kind = 'neighbour-mismatch'`,
      [bay.map((p) => p.id)],
    );
    expect(mismatches).toEqual([{ piece_id: bay[1]!.id, active: true }]);
  });

  it('when one piece of a fetched batch is refused by the engine, then only its job fails and the others are stored', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    const [{ design_id: designId }] = await t.ds.query(`SELECT design_id FROM piece WHERE id = $1`, [plant.piece.id]);
    const good = [await buildPiece(t.ds, plant.plantId), await buildPiece(t.ds, plant.plantId)];
    const bad = await buildPiece(t.ds, plant.plantId, { designId });
    await t.ds.query(`UPDATE member_design SET spec = spec || '{"length": -1}' WHERE id = $1`, [designId]);
    await jobs.startWorkers();
    // The broken design is shared by the plant's first piece and `bad`; both are refused, `good` are not.
    await jobs.boss.insert([...good, bad, plant.piece].map((p) => ({ name: QUEUES.projection, data: { pieceId: p.id }, singletonKey: p.id, retryLimit: 0 })));
    const states = async (): Promise<string[]> => (await Promise.all([...good, bad].map(async (p) => (await jobsOf(p.id))[0]?.state ?? 'none')));
    const done = await until(states, (v) => v.every((s) => s === 'completed' || s === 'failed'));
    expect(done).toEqual(['completed', 'completed', 'failed']);
    expect(await t.ds.query(`SELECT count(*)::int AS n FROM projection WHERE piece_id = ANY($1::uuid[])`, [good.map((p) => p.id)])).toEqual([{ n: 2 }]);
    const [failure] = await t.ds.query(`SELECT message FROM projection_failure WHERE piece_id = $1`, [bad.id]);
    expect(failure.message).toMatch(/length/i);
  });
});

describe('alert digest e-mail', () => {
  it('when flags are raised, then the QC managers get exactly one digest naming the pieces', async () => {
    const plant = await buildPlantWithUsers(t.ds);
    await buildReading(t.ds, plant.plantId, plant.piece.id, plant.users.inspector.id, { valueMm: 400 });
    const other = await buildPiece(t.ds, plant.plantId, { mark: 'ZZ-OUT' });
    await buildReading(t.ds, plant.plantId, other.id, plant.users.inspector.id, { valueMm: 400 });
    await jobs.projectPiece(plant.piece.id, 0);
    await jobs.projectPiece(other.id, 0);
    const mails = await until(() => mailsTo(plant.users.qc_manager.email), (m) => m.length > 0);
    await new Promise((r) => setTimeout(r, 3000)); // time for a second digest, which must not come
    const again = await mailsTo(plant.users.qc_manager.email);
    expect(again).toHaveLength(1);
    expect(mails[0]!.subject).toMatch(/new flags? on 2 pieces/);
    const unannounced = await t.ds.query(`SELECT count(*)::int AS n FROM piece_flag WHERE plant_id = $1 AND notified_at IS NULL`, [plant.plantId]);
    expect(unannounced).toEqual([{ n: 0 }]);
  });

  it('when the mail server is down as the digest goes out, then it is delivered once after the server returns', async () => {
    const smtp = 1931;
    const web = 1986;
    const cfg = loadConfig({ ...process.env, NODE_ENV: 'test', SMTP_PORT: String(smtp), ALERT_DIGEST_SECONDS: '0', LOG_LEVEL: 'silent' });
    const deps: Deps = { ...t.deps, cfg, mailer: createMailer(cfg), log: pino({ level: 'silent' }) };
    const plant = await buildPlantWithUsers(t.ds);
    await buildReading(t.ds, plant.plantId, plant.piece.id, plant.users.inspector.id, { valueMm: 400 });
    const { runProjection } = await import('#server/projections/projection.service');
    await runProjection(deps, plant.piece.id);
    const { sendDigest } = await import('#server/alerts/digest.service');
    const [{ n: raised }] = await t.ds.query(`SELECT count(*)::int AS n FROM piece_flag WHERE plant_id = $1 AND notified_at IS NULL`, [plant.plantId]);
    expect(raised).toBeGreaterThan(0);
    await expect(sendDigest(deps, plant.plantId)).rejects.toThrow(); // nothing listens on the port
    expect(await t.ds.query(`SELECT count(*)::int AS n FROM piece_flag WHERE plant_id = $1 AND notified_at IS NULL`, [plant.plantId])).toEqual([{ n: raised }]);
    const server = new MailDev({ smtp, web, ip: '127.0.0.1', webIp: '127.0.0.1', mcp: false, silent: true });
    await server.start();
    try {
      expect(await sendDigest(deps, plant.plantId)).toBe(raised);
      expect(await sendDigest(deps, plant.plantId)).toBe(0); // a retry after success sends nothing
      const list = (await (await fetch(`http://127.0.0.1:${web}/api/email`)).json()) as Array<{ to: Array<{ address: string }> }>;
      expect(list.filter((m) => m.to.some((x) => x.address === plant.users.qc_manager.email))).toHaveLength(1);
    } finally {
      await server.stop();
    }
  });
});
