import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildPlantWithUsers, PASSWORD } from '../helpers/factories';
import { tokenFrom, waitForMail } from '../helpers/inbox';

let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let admin: Session;
beforeAll(async () => {
  // With the session cache the server runs with: a deactivation must still end the session at once.
  t = await testApp({}, { sessionCache: true });
  plant = await buildPlantWithUsers(t.ds);
  admin = await signIn(t.app, plant.users.admin.email, PASSWORD);
});
afterAll(() => t.close());

const uniqueEmail = (p: string): string => `${p}-${Date.now()}-${Math.random().toString(36).slice(2, 7)}@test.example`;

describe('/api/users', () => {
  it('when an admin invites a user, then the invitation e-mail lets them choose a password and sign in', async () => {
    const email = uniqueEmail('new-inspector');
    const res = await admin.agent.post('/api/users').set('X-CSRF-Token', admin.csrf).send({ email, name: 'Robin Yard', role: 'inspector' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email, role: 'inspector', invited: true, active: true });
    const mail = await waitForMail(email);
    expect(mail.subject).toMatch(/invited to Crownwatch/);
    const accept = await request(t.app).post('/api/auth/reset').send({ token: tokenFrom(mail.text), password: 'my own yard passphrase' });
    expect(accept.status).toBe(200);
    expect(accept.body.role).toBe('inspector');
    const audit = await t.ds.query(`SELECT action FROM audit_event WHERE entity = 'user' AND entity_id = $1 ORDER BY id`, [res.body.id]);
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['invite', 'accept-invite']);
  });
  it('when the e-mail is already a user, then 409', async () => {
    const res = await admin.agent.post('/api/users').set('X-CSRF-Token', admin.csrf).send({ email: plant.users.engineer.email, name: 'Again', role: 'engineer' });
    expect(res.status).toBe(409);
  });
  it('when a viewer is invited without a job, then 400 names the job field', async () => {
    const res = await admin.agent.post('/api/users').set('X-CSRF-Token', admin.csrf).send({ email: uniqueEmail('viewer'), name: 'Erector', role: 'viewer' });
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.jobId).toBeDefined();
  });
  it('when a user is deactivated, then their session stops working at once', async () => {
    const target = await signIn(t.app, plant.users.qc_manager.email, PASSWORD);
    expect((await target.agent.get('/api/auth/me')).status).toBe(200);
    const res = await admin.agent.patch(`/api/users/${plant.users.qc_manager.id}`).set('X-CSRF-Token', admin.csrf).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.active).toBe(false);
    expect((await target.agent.get('/api/auth/me')).status).toBe(401);
  });
  it('when an admin changes a role, then it is audited with before and after', async () => {
    const res = await admin.agent.patch(`/api/users/${plant.users.inspector.id}`).set('X-CSRF-Token', admin.csrf).send({ role: 'engineer' });
    expect(res.body.role).toBe('engineer');
    const [a] = await t.ds.query(`SELECT before, after FROM audit_event WHERE entity = 'user' AND entity_id = $1 AND action = 'update' ORDER BY id DESC LIMIT 1`, [plant.users.inspector.id]);
    expect(a.before.role).toBe('inspector');
    expect(a.after.role).toBe('engineer');
  });
  it('when an admin tries to remove their own admin access, then 400', async () => {
    const res = await admin.agent.patch(`/api/users/${plant.users.admin.id}`).set('X-CSRF-Token', admin.csrf).send({ role: 'viewer' });
    expect(res.status).toBe(400);
  });
});
