// Background work on a queue kept in PostgreSQL (pg-boss 10): per-piece projections, the nightly run
// over every active piece, and the alert digest. "stately" queues keep at most one queued and one
// active job per key, so ten readings of one piece in a minute cause one projection run. The nightly run
// queues its pieces 250 to a job: a job per piece cost the database more than the engine's own time per
// piece (fetching and completing 50,000 job rows a night, measured). Once the night's batches are done,
// one job checks every erection bay from the night's results.
import PgBoss from 'pg-boss';
import { sendDigest } from '../alerts/digest.service';
import type { Deps, Jobs } from '../deps';
import { activePieceIds, type BatchResult, checkAllBays, runProjectionBatch } from '../projections/projection.service';
import { type BatchPool, createBatchPool } from '../projections/batch-pool';
import { compactPieceCounts } from '../pieces/pieces.repository';
import { compactReviewCounts } from '../review/review.repository';

/**
 * Projection jobs fetched at once (loaded, projected and stored together, a fixed number of statements
 * per batch, and each round trip costs this process about a quarter of a millisecond: 250 a batch ran
 * nights faster than 100 on a 10,000-piece dataset, measured), and how many workers fetch side by side:
 * one batch is in the engine while the others are being read or written by PostgreSQL (three kept this
 * process busier than two, measured; four did no better).
 */
const PROJECTION_BATCH = 250;
const PROJECTION_WORKERS = 3;

/** A batch of the nightly run: its pieces, and the moment they are projected as of (ISO; absent in jobs queued before it existed). */
interface BatchJob { pieceIds: string[]; asOf?: string }

export const QUEUES = { projection: 'projection', nightly: 'projection-nightly', nightlyBatch: 'projection-nightly-batch', nightlyBays: 'projection-nightly-bays', digest: 'alert-digest' } as const;

/**
 * The night's bay check looks whether batches are left every 200 ms for up to 10 s, then again as a job
 * of its own a second later: it starts within a fifth of a second of the last batch (the night's wall
 * time includes it), and a stopping server never waits long for it.
 */
const BAYS_LOOK_MS = 200;
const BAYS_LOOK_FOR_MS = 10_000;
const BAYS_AGAIN_SECONDS = 1;

export interface JobRunner extends Jobs {
  boss: PgBoss;
  startWorkers(): Promise<void>;
  stop(): Promise<void>;
}

export async function createJobs(d: Deps, opts: { schedule: boolean }): Promise<JobRunner> {
  const boss = new PgBoss({ connectionString: d.cfg.databaseUrl, schema: 'pgboss', max: 4, supervise: opts.schedule, schedule: opts.schedule, maintenanceIntervalSeconds: d.cfg.JOB_MAINTENANCE_SECONDS });
  boss.on('error', (err) => d.log.error({ err }, 'job queue error'));
  await boss.start();
  // createQueue leaves an existing queue as it was; updateQueue applies the configured expiry to it.
  const projectionQueue: PgBoss.Queue = { name: QUEUES.projection, policy: 'stately', retryLimit: 3, retryDelay: 2, retryBackoff: true, expireInSeconds: d.cfg.PROJECTION_EXPIRE_SECONDS };
  await boss.createQueue(QUEUES.projection, projectionQueue);
  await boss.updateQueue(QUEUES.projection, projectionQueue);
  await boss.createQueue(QUEUES.nightly, { name: QUEUES.nightly, policy: 'stately', retryLimit: 2, expireInSeconds: 3600 });
  // A batch of the nightly run: re-run whole when its worker dies or the database fails (a re-run stores the same).
  const batchQueue: PgBoss.Queue = { name: QUEUES.nightlyBatch, policy: 'standard', retryLimit: 3, retryDelay: 2, retryBackoff: true, expireInSeconds: d.cfg.PROJECTION_EXPIRE_SECONDS };
  await boss.createQueue(QUEUES.nightlyBatch, batchQueue);
  await boss.updateQueue(QUEUES.nightlyBatch, batchQueue);
  // The night's bay check: one queued at a time per plant (or for all plants), retried if the database fails.
  await boss.createQueue(QUEUES.nightlyBays, { name: QUEUES.nightlyBays, policy: 'stately', retryLimit: 3, retryDelay: 2, retryBackoff: true, expireInSeconds: 600 });
  // The digest is retried for about a day: a mail server that is down for a while loses nothing.
  await boss.createQueue(QUEUES.digest, { name: QUEUES.digest, policy: 'stately', retryLimit: 40, retryDelay: 15, retryBackoff: true });

  // Nightly batches in threads of their own when configured (batch-pool.ts), else in this thread.
  let pool: BatchPool | null = null; // made when the workers start
  const nightlyBatch = (ids: string[], asOf: Date): Promise<BatchResult> => (pool ? pool.run(ids, asOf, 'none') : runProjectionBatch(d, ids, asOf, { bays: 'none' }));
  const checkBaysAfterNight = (plantId: string | undefined, seconds: number): Promise<string | null> =>
    boss.send(QUEUES.nightlyBays, { plantId }, { singletonKey: plantId ?? 'all', startAfter: seconds });
  let started = false;
  let stopping = false;
  const batchWorkers: string[] = [];
  const jobs: JobRunner = {
    boss,
    async projectPiece(pieceId, delaySeconds = d.cfg.PROJECTION_DELAY_SECONDS) {
      await boss.send(QUEUES.projection, { pieceId }, { singletonKey: pieceId, startAfter: delaySeconds });
    },
    async projectAll(plantId, asOf = new Date()) {
      const ids = await activePieceIds(d, plantId);
      const batches: Array<{ name: string; data: BatchJob }> = [];
      for (let i = 0; i < ids.length; i += PROJECTION_BATCH) batches.push({ name: QUEUES.nightlyBatch, data: { pieceIds: ids.slice(i, i + PROJECTION_BATCH), asOf: asOf.toISOString() } });
      if (batches.length) await boss.insert(batches);
      for (const id of batchWorkers) boss.notifyWorker(id); // idle workers start now, not at their next poll
      await checkBaysAfterNight(plantId, 0);
      return ids.length;
    },
    async alertDigest(plantId) {
      await boss.send(QUEUES.digest, { plantId }, { singletonKey: plantId, startAfter: d.cfg.ALERT_DIGEST_SECONDS });
    },
    async startWorkers() {
      if (started) return; // once per runner
      started = true;
      if (d.cfg.PROJECTION_THREADS > 0) pool = createBatchPool(d.cfg, d.cfg.PROJECTION_THREADS, (err) => d.log.error({ err }, 'projection thread failed; its batches go back to the queue'));
      // pg-boss waits out the polling interval after every fetch; after a full batch the worker is told
      // to fetch again at once, so a nightly run of hundreds of batches is not paced by the interval.
      // Trouble with the database fails the batch and the queue retries it (a re-run stores the same
      // result); a piece the engine refuses fails its own job only.
      // New flags mean a digest for their plants; the review totals' and piece counts' delta rows are folded each time.
      const afterRun = async (raised: BatchResult['raised']): Promise<void> => {
        for (const plantId of new Set(raised.map((x) => x.plantId))) await jobs.alertDigest(plantId);
        await compactReviewCounts(d.ds);
        await compactPieceCounts(d.ds);
      };
      for (let w = 0; w < PROJECTION_WORKERS; w++) {
        const worker = { id: '' }; // known once work() returns, before the first batch ends
        worker.id = await boss.work<{ pieceId: string }>(QUEUES.projection, { batchSize: PROJECTION_BATCH, pollingIntervalSeconds: 0.5 }, async (batch) => {
          const r = await runProjectionBatch(d, [...new Set(batch.map((j) => j.data.pieceId))]);
          await afterRun(r.raised);
          for (const f of r.failed) {
            const message = f.error instanceof Error ? f.error.message : String(f.error);
            for (const job of batch.filter((j) => j.data.pieceId === f.pieceId)) await boss.fail(QUEUES.projection, job.id, { message });
          }
          if (batch.length === PROJECTION_BATCH && worker.id) boss.notifyWorker(worker.id);
        });
        // A piece the engine refuses is recorded in projection_failure; its batch still completes.
        // A batch is projected as of the night it belongs to, also when it runs late or is retried.
        const nightly = { id: '' };
        nightly.id = await boss.work<BatchJob>(QUEUES.nightlyBatch, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
          const asOf = job!.data.asOf ? new Date(job!.data.asOf) : new Date();
          await afterRun((await nightlyBatch(job!.data.pieceIds, asOf)).raised);
          if (nightly.id) boss.notifyWorker(nightly.id);
        });
        batchWorkers.push(nightly.id);
      }
      // The scheduled run is as of the moment it was queued; a run queued by hand may name its night.
      await boss.work<{ asOf?: string }>(QUEUES.nightly, { pollingIntervalSeconds: 0.5, includeMetadata: true }, async ([job]) => {
        const n = await jobs.projectAll(undefined, job?.data?.asOf ? new Date(job.data.asOf) : job?.createdOn);
        d.log.info({ pieces: n }, 'nightly projection queued');
      });
      // Every bay once a night, after the night's last batch (also of a batch retried later), whatever
      // changed its members (a piece shipped, moved, re-planned, projected anew).
      await boss.work<{ plantId?: string }>(QUEUES.nightlyBays, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
        const giveUp = Date.now() + BAYS_LOOK_FOR_MS;
        for (;;) {
          const [{ n }] = await d.ds.query(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = $1 AND state < 'completed'`, [QUEUES.nightlyBatch]);
          if (n === 0) break;
          if (stopping || Date.now() > giveUp) {
            await checkBaysAfterNight(job!.data.plantId, BAYS_AGAIN_SECONDS);
            return { batchesLeft: n };
          }
          await new Promise((r) => setTimeout(r, BAYS_LOOK_MS));
        }
        const raised = await checkAllBays(d, job!.data.plantId);
        await afterRun(raised);
        return { raised: raised.length }; // kept as the job's output
      });
      await boss.work<{ plantId: string }>(QUEUES.digest, { pollingIntervalSeconds: 2 }, async (batch) => {
        for (const job of batch) await sendDigest(d, job.data.plantId);
      });
      if (opts.schedule) await boss.schedule(QUEUES.nightly, '30 2 * * *', {}, { tz: 'UTC' });
    },
    async stop() {
      stopping = true;
      await boss.stop({ graceful: true, wait: true, timeout: 20_000 });
      await pool?.close();
    },
  };
  return jobs;
}
