import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, testApp, type TestApp } from '../helpers/app';
import { buildPlant, buildUser, PASSWORD } from '../helpers/factories';
import { mailsTo, tokenFrom, waitForMail } from '../helpers/inbox';

let t: TestApp;
let plantId: string;
beforeAll(async () => {
  t = await testApp({ LOGIN_LIMIT: '3' });
  plantId = (await buildPlant(t.ds)).id;
});
afterAll(() => t.close());

const sessionCookie = (res: request.Response): string => ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('cw_session=')) ?? '';
const tokenOf = (res: request.Response): string => /^cw_session=([^;]+)/.exec(sessionCookie(res))![1]!;

describe('POST /api/auth/login', () => {
  it('when the password is right, then it returns the user and sets an httpOnly SameSite=Strict session cookie', async () => {
    const u = await buildUser(t.ds, plantId, 'engineer');
    const res = await request(t.app).post('/api/auth/login').send({ email: u.email.toUpperCase(), password: PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: u.id, role: 'engineer', plantId });
    expect(sessionCookie(res)).toMatch(/HttpOnly/);
    expect(sessionCookie(res)).toMatch(/SameSite=Strict/);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', `cw_session=${tokenOf(res)}`);
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(u.email);
  });
  it('when the password is wrong or the e-mail unknown, then 401 with the same message', async () => {
    const u = await buildUser(t.ds, plantId, 'inspector');
    const wrong = await request(t.app).post('/api/auth/login').send({ email: u.email, password: 'not the password' });
    const unknown = await request(t.app).post('/api/auth/login').send({ email: 'nobody@test.example', password: 'whatever12' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.code).toBe('unauthenticated');
    expect(wrong.body.message).toBe(unknown.body.message);
  });
  it('when the body is malformed, then 400 with field errors', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.code).toBe('validation_failed');
    expect(Object.keys(res.body.fieldErrors)).toEqual(expect.arrayContaining(['email', 'password']));
  });
  it('when a user is deactivated, then sign-in is refused', async () => {
    const u = await buildUser(t.ds, plantId, 'inspector', { active: false });
    const res = await request(t.app).post('/api/auth/login').send({ email: u.email, password: PASSWORD });
    expect(res.status).toBe(401);
  });
  it('when one address and e-mail fail more than the limit, then 429, while another e-mail still signs in', async () => {
    const u = await buildUser(t.ds, plantId, 'inspector');
    const other = await buildUser(t.ds, plantId, 'inspector');
    for (let i = 0; i < 3; i++) await request(t.app).post('/api/auth/login').send({ email: u.email, password: 'wrong password' });
    const blocked = await request(t.app).post('/api/auth/login').send({ email: u.email, password: PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('rate_limited');
    const fine = await request(t.app).post('/api/auth/login').send({ email: other.email, password: PASSWORD });
    expect(fine.status).toBe(200);
  });
});

describe('session tokens', () => {
  const claims = { csrf: 'x'.repeat(32) };
  const opts = { issuer: 'crownwatch', audience: 'crownwatch-web' };
  const me = (token: string) => request(t.app).get('/api/auth/me').set('Cookie', `cw_session=${token}`);
  it('when the token has expired, then 401', async () => {
    const u = await buildUser(t.ds, plantId, 'inspector');
    const token = jwt.sign({ ...claims, exp: Math.floor(Date.now() / 1000) - 10 }, t.cfg.jwtSecret, { ...opts, subject: u.id, algorithm: 'HS256' });
    expect((await me(token)).status).toBe(401);
  });
  it('when the payload was changed after signing, then 401', async () => {
    const a = await buildUser(t.ds, plantId, 'inspector');
    const b = await buildUser(t.ds, plantId, 'admin');
    const token = jwt.sign(claims, t.cfg.jwtSecret, { ...opts, subject: a.id, algorithm: 'HS256', expiresIn: 600 });
    const [h, p, s] = token.split('.');
    const payload = JSON.parse(Buffer.from(p!, 'base64url').toString());
    const forged = `${h}.${Buffer.from(JSON.stringify({ ...payload, sub: b.id })).toString('base64url')}.${s}`;
    expect((await me(forged)).status).toBe(401);
    expect((await me(token)).status).toBe(200);
  });
  it('when the token says alg "none", then 401', async () => {
    const u = await buildUser(t.ds, plantId, 'admin');
    const enc = (o: object): string => Buffer.from(JSON.stringify(o)).toString('base64url');
    const now = Math.floor(Date.now() / 1000);
    const token = `${enc({ alg: 'none', typ: 'JWT' })}.${enc({ ...claims, sub: u.id, iss: 'crownwatch', aud: 'crownwatch-web', iat: now, exp: now + 600 })}.`;
    expect((await me(token)).status).toBe(401);
  });
  it('when the token is signed with another secret, then 401', async () => {
    const u = await buildUser(t.ds, plantId, 'admin');
    const token = jwt.sign(claims, 'another-secret-another-secret-0123', { ...opts, subject: u.id, algorithm: 'HS256', expiresIn: 600 });
    expect((await me(token)).status).toBe(401);
  });
  it('when a token was accepted by a server with another secret in the same process, then this one still refuses it', async () => {
    const u = await buildUser(t.ds, plantId, 'admin');
    const other = await testApp({ JWT_SECRET: 'a-second-server-secret-0123456789abc' });
    try {
      const token = jwt.sign(claims, other.cfg.jwtSecret, { ...opts, subject: u.id, algorithm: 'HS256', expiresIn: 600 });
      expect((await request(other.app).get('/api/auth/me').set('Cookie', `cw_session=${token}`)).status).toBe(200);
      expect((await me(token)).status).toBe(401); // verified tokens are remembered per secret
    } finally {
      await other.close();
    }
  });
});

describe('POST /api/auth/logout and CSRF', () => {
  it('when a write comes without the CSRF header, then 403 csrf_failed', async () => {
    const u = await buildUser(t.ds, plantId, 'inspector');
    const s = await signIn(t.app, u.email, PASSWORD);
    const res = await s.agent.post('/api/auth/logout');
    expect(res.status).toBe(403);
    expect(res.body.code).toBe('csrf_failed');
  });
  it('when signing out with the header, then the session cookie is cleared and /me is 401', async () => {
    const u = await buildUser(t.ds, plantId, 'inspector');
    const s = await signIn(t.app, u.email, PASSWORD);
    const out = await s.agent.post('/api/auth/logout').set('X-CSRF-Token', s.csrf);
    expect(out.status).toBe(204);
    expect((await s.agent.get('/api/auth/me')).status).toBe(401);
  });
});

describe('password reset by e-mail', () => {
  it('when a reset is asked for, then the e-mailed link sets a new password once', async () => {
    const u = await buildUser(t.ds, plantId, 'qc_manager');
    const ask = await request(t.app).post('/api/auth/forgot').send({ email: u.email });
    expect(ask.status).toBe(202);
    const mail = await waitForMail(u.email);
    expect(mail.subject).toMatch(/Reset your Crownwatch password/);
    const token = tokenFrom(mail.text);
    const reset = await request(t.app).post('/api/auth/reset').send({ token, password: 'a brand new passphrase' });
    expect(reset.status).toBe(200);
    expect((await request(t.app).post('/api/auth/login').send({ email: u.email, password: 'a brand new passphrase' })).status).toBe(200);
    expect((await request(t.app).post('/api/auth/login').send({ email: u.email, password: PASSWORD })).status).toBe(401);
    const again = await request(t.app).post('/api/auth/reset').send({ token, password: 'yet another passphrase' });
    expect(again.status).toBe(400);
    expect(again.body.code).toBe('token_invalid');
  });
  it('when the address is unknown, then the answer is the same and no e-mail goes out', async () => {
    const res = await request(t.app).post('/api/auth/forgot').send({ email: 'unknown-person@test.example' });
    expect(res.status).toBe(202);
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailsTo('unknown-person@test.example')).toHaveLength(0);
  });
  it('when the new password is longer than 72 bytes, then it is refused with a clear message', async () => {
    const res = await request(t.app).post('/api/auth/reset').send({ token: 'x'.repeat(40), password: 'é'.repeat(37) });
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.password[0]).toMatch(/at most 72 bytes/);
  });
});
