// `npm run bench:nightly`: wall time of the nightly projection over every active piece of the plant-sized
// dataset, queue included (the nightly job queues the pieces a hundred to a job; the workers load,
// project, store and flag each batch), beside the engine alone on the same inputs in one process.
// Target: ≤ 2× the engine alone. BENCH_PIECES makes a smaller dataset for a quick look.
import pino from 'pino';
import { projectPiece, type ProjectionInput } from '#shared/projection/project';
import { createDataSource } from '../db/data-source';
import { createJobs, QUEUES } from '../jobs/queue';
import { createMailer } from '../mail/mailer';
import { activePieceIds } from '../projections/projection.service';
import { loadPiecesForProjection } from '../projections/projection.repository';
import { freshBenchDatabase, makeDataset } from './dataset';
import { median, spread } from './stats';

const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

async function main(): Promise<void> {
  const pieces = Number(process.env.BENCH_PIECES ?? 50_000);
  const cfg = await freshBenchDatabase();
  const ds = createDataSource(cfg.databaseUrl, 10);
  await ds.initialize();
  await makeDataset(ds, pieces);
  const deps = { ds, cfg, mailer: createMailer(cfg), log: pino({ level: 'silent' }) };
  const ids = await activePieceIds(deps);
  console.log(`dataset: ${pieces.toLocaleString('en-US')} pieces, ${ids.length.toLocaleString('en-US')} not shipped (the nightly run covers those)`);

  // The engine alone: inputs loaded first (not timed), then every projection in one loop.
  const now = new Date();
  const inputs: ProjectionInput[] = [];
  for (let i = 0; i < ids.length; i += 500) for (const p of await loadPiecesForProjection(ds, ids.slice(i, i + 500), now)) inputs.push(p.input);
  const engineAlone = (): number => {
    const e0 = process.hrtime.bigint();
    for (const input of inputs) projectPiece(input);
    return Number(process.hrtime.bigint() - e0) / 1e9;
  };

  // The nightly run through the queue, as the server runs it: the first night after the dataset is
  // loaded (every stored projection and flag replaced), then further nights (yesterday's results there),
  // each beside the engine alone measured just before it (the machine's speed drifts).
  const fresh = await createJobs(deps, { schedule: false });
  await fresh.startWorkers();
  const night = async (): Promise<{ engineS: number; seconds: number; stored: number }> => {
    const engineS = engineAlone();
    const q0 = Date.now();
    await fresh.boss.send(QUEUES.nightly, {});
    await sleep(1000);
    while ((await fresh.boss.getQueueSize(QUEUES.nightly, { before: 'completed' })) > 0 || (await fresh.boss.getQueueSize(QUEUES.nightlyBatch, { before: 'completed' })) > 0) await sleep(250);
    const seconds = (Date.now() - q0) / 1000;
    const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM projection WHERE computed_at >= $1`, [new Date(q0)]);
    return { engineS, seconds, stored: n };
  };
  const first = await night();
  const next = [];
  for (let r = 0; r < Number(process.env.BENCH_ROUNDS ?? 3); r++) next.push(await night());
  await fresh.stop();
  await ds.destroy();

  const engines = [first, ...next].map((x) => x.engineS);
  console.log(`engine alone, ${inputs.length} pieces in one process      ${median(engines).toFixed(1)} s [${spread(engines, 1)}]   (${Math.round(inputs.length / median(engines))} pieces/s)`);
  console.log(`first night (every result new)     ${first.seconds.toFixed(1).padStart(6)} s   (${Math.round(first.stored / first.seconds)} pieces/s; ${first.stored} projections stored)   ratio ${(first.seconds / first.engineS).toFixed(1)}× the engine alone`);
  const secs = next.map((x) => x.seconds);
  const ratios = next.map((x) => x.seconds / x.engineS);
  console.log(`next nights (yesterday stored)     ${median(secs).toFixed(1).padStart(6)} s [${spread(secs, 1)}]   (${next.map((x) => x.stored).join(', ')} projections stored)   ratio ${median(ratios).toFixed(1)}× [${spread(ratios, 1)}] the engine alone`);
  console.log(`target ≤ 2× the engine alone: ${median(ratios) <= 2 ? 'met' : 'NOT met'} on a typical night, ${first.seconds <= 2 * first.engineS ? 'met' : 'NOT met'} on the first`);
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
