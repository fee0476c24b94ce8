import jwt from 'jsonwebtoken';
import type { Express } from 'express';
import pino from 'pino';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createApp } from '#server/app';
import { cachedSessionUsers } from '#server/auth/session-users';
import { loadConfig, type Config } from '#server/config';
import { createDataSource } from '#server/db/data-source';
import type { Deps } from '#server/deps';
import { createMailer } from '#server/mail/mailer';

export interface TestApp { app: Express; ds: DataSource; cfg: Config; deps: Deps; close: () => Promise<void> }

/** The real app on the real test database, one per test file; each test makes its own plant and users. */
export async function testApp(overrides: Record<string, string> = {}, o: { sessionCache?: boolean; listenerName?: string } = {}): Promise<TestApp> {
  const cfg = loadConfig({ ...process.env, NODE_ENV: 'test', BCRYPT_COST: '10', LOG_LEVEL: 'silent', ...overrides });
  const ds = createDataSource(cfg.databaseUrl, 4);
  await ds.initialize();
  const log = pino({ level: process.env.TEST_LOG ?? 'silent' });
  // Most tests change users straight in the database; the cache (as the server runs it) is opt-in.
  const sessions = o.sessionCache ? await cachedSessionUsers(ds, cfg.databaseUrl, log, o.listenerName) : undefined;
  const deps: Deps = { ds, cfg, mailer: createMailer(cfg), log, sessions };
  const app = createApp(deps, null);
  return {
    app, ds, cfg, deps,
    close: async () => {
      await sessions?.close();
      await ds.destroy();
    },
  };
}

export interface Session { agent: ReturnType<typeof request.agent>; csrf: string; user: { id: string; plantId: string } }

/** Signs in through the real endpoint and returns an agent that sends the CSRF header on writes. */
export async function signIn(app: Express, email: string, password: string): Promise<Session> {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const csrf = cookies.map((c) => /^cw_csrf=([^;]+)/.exec(c)?.[1]).find(Boolean) ?? '';
  return { agent, csrf, user: { id: res.body.id, plantId: res.body.plantId } };
}

/** Cookie and CSRF header of a session for a user, minted as the server does (for wide matrix tests). */
export function sessionHeaders(cfg: Config, userId: string): Record<string, string> {
  const csrf = `csrf-${userId}`;
  const token = jwt.sign({ csrf }, cfg.jwtSecret, { algorithm: 'HS256', subject: userId, issuer: 'crownwatch', audience: 'crownwatch-web', expiresIn: 600 });
  return { Cookie: `cw_session=${token}; cw_csrf=${csrf}`, 'X-CSRF-Token': csrf };
}
