// Threads for the nightly run's batches. The run is bound by the CPU of one thread (the engine, and the
// loading and hashing around it; PostgreSQL has the rest of the machine), so batches run in threads of
// their own: on the project's two-core machine two threads did a 40,000-piece night about a third faster
// than the server's thread alone, measured. With PROJECTION_THREADS=0 they run in the server's thread.
import { Worker } from 'node:worker_threads';
import type { Config } from '../config';
import type { BatchResult, BayCheck } from './projection.service';

export interface BatchRequest { id: number; pieceIds: string[]; asOf: string; bays: BayCheck }
/** A batch's outcome as it crosses threads: a refused piece's error as its message. */
export type BatchReply =
  | { id: number; result: { projected: number; raised: BatchResult['raised']; failed: Array<{ pieceId: string; message: string }> } }
  | { id: number; error: string };

export interface BatchPool {
  run(pieceIds: string[], asOf: Date, bays: BayCheck): Promise<BatchResult>;
  close(): Promise<void>;
}

/**
 * The thread registers tsx's loader (the server runs its TypeScript the same way) and loads
 * batch-thread.ts, both found from this file (the tests' module runner may not resolve: the bare name then).
 */
const TSX_API = typeof import.meta.resolve === 'function' ? import.meta.resolve('tsx/esm/api') : 'tsx/esm/api';
const BOOT = `import(${JSON.stringify(TSX_API)})
  .then((tsx) => { tsx.register(); return import(${JSON.stringify(new URL('./batch-thread.ts', import.meta.url).href)}); });`;

interface Slot { worker: Worker; busy: number; pending: Map<number, { resolve: (r: BatchResult) => void; reject: (e: Error) => void }> }

export function createBatchPool(cfg: Config, size: number, onThreadError: (err: Error) => void = () => {}): BatchPool {
  let next = 0;
  let closing = false;
  const slots: Slot[] = [];
  const exited = new WeakSet<Worker>();
  const start = (i: number): void => {
    const worker = new Worker(BOOT, { eval: true, workerData: cfg });
    const slot: Slot = { worker, busy: 0, pending: new Map() };
    slots[i] = slot;
    worker.on('message', (reply: BatchReply) => {
      const p = slot.pending.get(reply.id);
      if (!p) return;
      slot.pending.delete(reply.id);
      slot.busy--;
      if ('error' in reply) p.reject(new Error(reply.error));
      else p.resolve({ ...reply.result, failed: reply.result.failed.map((f) => ({ pieceId: f.pieceId, error: new Error(f.message) })) });
    });
    // A thread that dies fails its batches (the queue runs them again) and is replaced.
    // Called on 'error' and again on 'exit': reported and replaced once.
    const fail = (err: Error): void => {
      if (!closing && slots[i] === slot) onThreadError(err);
      for (const p of slot.pending.values()) p.reject(err);
      slot.pending.clear();
      slot.busy = 0;
      if (!closing && slots[i] === slot) {
        slots[i] = { ...slot, busy: Number.MAX_SAFE_INTEGER }; // no new batches until its successor starts
        setTimeout(() => !closing && start(i), 1000).unref();
      }
    };
    worker.on('error', fail);
    worker.on('exit', (code) => {
      exited.add(worker);
      fail(new Error(`projection thread exited with code ${code}`));
    });
  };
  for (let i = 0; i < size; i++) start(i);
  return {
    run(pieceIds, asOf, bays) {
      const slot = slots.reduce((a, b) => (b.busy < a.busy ? b : a));
      if (slot.busy === Number.MAX_SAFE_INTEGER) return Promise.reject(new Error('no projection thread is running (replacements start within a second)'));
      const id = ++next;
      slot.busy++;
      return new Promise<BatchResult>((resolve, reject) => {
        slot.pending.set(id, { resolve, reject });
        slot.worker.postMessage({ id, pieceIds, asOf: asOf.toISOString(), bays } satisfies BatchRequest);
      });
    },
    async close() {
      closing = true;
      await Promise.all(slots.filter((s) => !exited.has(s.worker)).map((s) => new Promise<void>((r) => {
        s.worker.once('exit', () => r());
        s.worker.postMessage('close');
      })));
    },
  };
}
