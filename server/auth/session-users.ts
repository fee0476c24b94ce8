// Who a signed-in user is (role, plant, active) is read on every request and changes rarely. A process
// keeps it in memory while it is listening for changes: a statement-level trigger on `app_user` and
// `plant` sends a notification on every change (migration SessionUserNotify) and each process empties
// its cache on it. While the listening connection is down the cache is not used at all, so a change can
// never be missed; the services that change users here also empty it before they answer, so a
// deactivated user is refused from the next request on.
import pg from 'pg';
import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { SessionUser } from '#shared/api/auth';
import { loadSessionUser } from '../users/users.repository';

export const SESSION_USERS_CHANNEL = 'cw_session_users';
/** A backstop: an entry is read again after this long whatever happened. */
const MAX_AGE_MS = 60_000;
const RETRY_MS = 2_000;
const MAX_ENTRIES = 10_000;

export interface SessionUsers {
  get(userId: string): Promise<SessionUser | null>;
  /** Empties the cache (a change to users or plants was committed). */
  forget(): void;
  /** True while changes are being listened for, that is while the cache is in use. */
  readonly listening: boolean;
  close(): Promise<void>;
}

/** No cache: every request reads the user (tests that change users behind the app's back). */
export function uncachedSessionUsers(ds: DataSource): SessionUsers {
  return { get: (id) => loadSessionUser(ds, id), forget: () => undefined, listening: false, close: async () => undefined };
}

/** `name`: the listening connection's application name, as `pg_stat_activity` shows it. */
export async function cachedSessionUsers(ds: DataSource, databaseUrl: string, log: Logger, name = 'crownwatch-session-users'): Promise<SessionUsers> {
  const cache = new Map<string, { user: SessionUser; at: number }>();
  // Bumped on every change: a read that started before a change must not store what it read.
  let generation = 0;
  let client: pg.Client | null = null;
  let closed = false;
  let retry: NodeJS.Timeout | null = null;

  const forget = (): void => {
    generation++;
    cache.clear();
  };

  const listen = async (): Promise<void> => {
    retry = null;
    if (closed) return;
    const c = new pg.Client({ connectionString: databaseUrl, application_name: name });
    c.on('error', (err) => log.warn({ err }, 'session-user change listener failed'));
    try {
      await c.connect();
      c.on('notification', forget);
      await c.query(`LISTEN ${SESSION_USERS_CHANNEL}`);
    } catch {
      await c.end().catch(() => undefined);
      if (!closed) retry = setTimeout(() => void listen(), RETRY_MS);
      return;
    }
    // Only a connection that listens schedules the next attempt when it ends, so there is one at a time.
    c.on('end', () => {
      client = null;
      forget();
      if (!closed) retry = setTimeout(() => void listen(), RETRY_MS);
    });
    forget(); // whatever changed while nobody was listening
    client = c;
  };
  await listen();

  return {
    get listening() {
      return client !== null;
    },
    forget,
    async get(userId) {
      if (!client) return loadSessionUser(ds, userId);
      const hit = cache.get(userId);
      if (hit && Date.now() - hit.at < MAX_AGE_MS) return hit.user;
      const seen = generation;
      const user = await loadSessionUser(ds, userId);
      if (user && seen === generation && client) {
        if (cache.size >= MAX_ENTRIES) cache.clear();
        cache.set(userId, { user, at: Date.now() });
      }
      return user;
    },
    async close() {
      closed = true;
      if (retry) clearTimeout(retry);
      const c = client;
      client = null;
      await c?.end().catch(() => undefined);
    },
  };
}
