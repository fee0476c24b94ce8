// Background work on a queue kept in PostgreSQL (pg-boss 10): per-piece projections, the nightly run
// over every active piece, and the alert digest. "stately" queues keep at most one queued and one
// active job per key, so ten readings of one piece in a minute cause one projection run.
import PgBoss from 'pg-boss';
import { sendDigest } from '../alerts/digest.service';
import type { Deps, Jobs } from '../deps';
import { activePieceIds, runProjection } from '../projections/projection.service';

/** Projection jobs fetched at once, and how many of them run side by side (each holds one connection). */
const PROJECTION_BATCH = 40;
const PROJECTION_LANES = 4;

export const QUEUES = { projection: 'projection', nightly: 'projection-nightly', digest: 'alert-digest' } as const;

export interface JobRunner extends Jobs {
  boss: PgBoss;
  startWorkers(): Promise<void>;
  stop(): Promise<void>;
}

export async function createJobs(d: Deps, opts: { schedule: boolean }): Promise<JobRunner> {
  const boss = new PgBoss({ connectionString: d.cfg.databaseUrl, schema: 'pgboss', max: 4, supervise: opts.schedule, schedule: opts.schedule });
  boss.on('error', (err) => d.log.error({ err }, 'job queue error'));
  await boss.start();
  await boss.createQueue(QUEUES.projection, { name: QUEUES.projection, policy: 'stately', retryLimit: 3, retryDelay: 2, retryBackoff: true, expireInSeconds: 300 });
  await boss.createQueue(QUEUES.nightly, { name: QUEUES.nightly, policy: 'stately', retryLimit: 2, expireInSeconds: 3600 });
  // The digest is retried for about a day: a mail server that is down for a while loses nothing.
  await boss.createQueue(QUEUES.digest, { name: QUEUES.digest, policy: 'stately', retryLimit: 40, retryDelay: 15, retryBackoff: true });

  const jobs: JobRunner = {
    boss,
    async projectPiece(pieceId, delaySeconds = d.cfg.PROJECTION_DELAY_SECONDS) {
      await boss.send(QUEUES.projection, { pieceId }, { singletonKey: pieceId, startAfter: delaySeconds });
    },
    async projectAll(plantId) {
      const ids = await activePieceIds(d, plantId);
      for (const id of ids) await boss.send(QUEUES.projection, { pieceId: id }, { singletonKey: id });
      return ids.length;
    },
    async alertDigest(plantId) {
      await boss.send(QUEUES.digest, { plantId }, { singletonKey: plantId, startAfter: d.cfg.ALERT_DIGEST_SECONDS });
    },
    async startWorkers() {
      // pg-boss waits out the polling interval after every fetch; after a full batch the worker is told
      // to fetch again at once, so the nightly fan-out of tens of thousands of pieces is not paced by
      // the interval. A failure fails the batch and the queue retries it; a re-run stores the same result.
      const projectionWorker = { id: '' }; // known once work() returns, before the first batch ends
      projectionWorker.id = await boss.work<{ pieceId: string }>(QUEUES.projection, { batchSize: PROJECTION_BATCH, pollingIntervalSeconds: 0.5 }, async (batch) => {
        const queue = [...batch];
        const errors: unknown[] = [];
        const lane = async (): Promise<void> => {
          for (let job = queue.shift(); job; job = queue.shift()) {
            try {
              const r = await runProjection(d, job.data.pieceId);
              if (r.raised > 0 && r.plantId) await jobs.alertDigest(r.plantId);
            } catch (e) {
              errors.push(e);
            }
          }
        };
        await Promise.all(Array.from({ length: PROJECTION_LANES }, lane));
        if (batch.length === PROJECTION_BATCH && projectionWorker.id) boss.notifyWorker(projectionWorker.id);
        if (errors.length) throw errors[0];
      });
      await boss.work(QUEUES.nightly, { pollingIntervalSeconds: 5 }, async () => {
        const n = await jobs.projectAll();
        d.log.info({ pieces: n }, 'nightly projection queued');
      });
      await boss.work<{ plantId: string }>(QUEUES.digest, { pollingIntervalSeconds: 2 }, async (batch) => {
        for (const job of batch) await sendDigest(d, job.data.plantId);
      });
      if (opts.schedule) await boss.schedule(QUEUES.nightly, '30 2 * * *', {}, { tz: 'UTC' });
    },
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 20_000 });
    },
  };
  return jobs;
}
