import type { Server } from 'node:http';
import { createApp } from './app';
import { cachedSessionUsers } from './auth/session-users';
import { loadConfig, type Config } from './config';
import { createDataSource } from './db/data-source';
import { createJobs } from './jobs/queue';
import { createLogger } from './logger';
import { createMailer } from './mail/mailer';

export interface Running { server: Server; url: string; stop: () => Promise<void> }

/** Connects to the database and serves API and client from one process. */
export async function startServer(cfg: Config = loadConfig()): Promise<Running> {
  const log = createLogger(cfg.LOG_LEVEL);
  const ds = createDataSource(cfg.databaseUrl);
  await ds.initialize();
  const sessions = await cachedSessionUsers(ds, cfg.databaseUrl, log);
  const deps = { ds, cfg, mailer: createMailer(cfg), log, sessions };
  const jobs = cfg.JOBS === 'on' ? await createJobs(deps, { schedule: true }) : null;
  if (jobs) await jobs.startWorkers();
  const app = createApp({ ...deps, jobs: jobs ?? undefined });
  const server = await new Promise<Server>((resolveListen, reject) => {
    const s = app.listen(cfg.PORT, cfg.HOST, () => resolveListen(s));
    s.on('error', reject);
  });
  const stop = async (): Promise<void> => {
    await new Promise<void>((r) => server.close(() => r()));
    await jobs?.stop();
    await sessions.close();
    await ds.destroy();
  };
  return { server, url: cfg.publicUrl, stop };
}

/** Graceful stop on SIGTERM/SIGINT: finish requests in flight, close the pool, exit 0. */
export function stopOnSignals(stop: () => Promise<void>): void {
  let stopping = false;
  for (const sig of ['SIGTERM', 'SIGINT'] as const) {
    process.on(sig, () => {
      if (stopping) return;
      stopping = true;
      stop().then(
        () => process.exit(0),
        () => process.exit(1),
      );
    });
  }
}
