// A thread that runs nightly projection batches with its own database connections (batch-pool.ts). The
// server's thread only hands it piece ids and gets back what was raised: the loading, the engine and the
// writing of a batch all happen here, so two threads keep both cores of a small server busy.
import { parentPort, workerData } from 'node:worker_threads';
import pino from 'pino';
import type { Config } from '../config';
import { createDataSource } from '../db/data-source';
import type { Deps } from '../deps';
import { createMailer } from '../mail/mailer';
import type { BatchReply, BatchRequest } from './batch-pool';
import { runProjectionBatch } from './projection.service';

const cfg = workerData as Config;
const ds = createDataSource(cfg.databaseUrl, 2);
const ready = ds.initialize();
const d: Deps = { ds, cfg, mailer: createMailer(cfg), log: pino({ level: 'silent' }) };

parentPort!.on('message', (msg: BatchRequest | 'close') => {
  if (msg === 'close') {
    void ready.then(() => ds.destroy()).finally(() => process.exit(0));
    return;
  }
  void (async (): Promise<BatchReply> => {
    try {
      await ready;
      const r = await runProjectionBatch(d, msg.pieceIds, new Date(msg.asOf), { bays: msg.bays });
      const failed = r.failed.map((f) => ({ pieceId: f.pieceId, message: f.error instanceof Error ? f.error.message : String(f.error) }));
      return { id: msg.id, result: { projected: r.projected, raised: r.raised, failed } };
    } catch (e) {
      return { id: msg.id, error: e instanceof Error ? e.message : String(e) };
    }
  })().then((reply) => parentPort!.postMessage(reply));
});
