import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { predict } from '#shared/camber/predict';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildPlantWithUsers, PASSWORD } from '../helpers/factories';

let t: TestApp;
let engineer: Session;
let inspector: Session;
beforeAll(async () => {
  t = await testApp();
  const p = await buildPlantWithUsers(t.ds);
  engineer = await signIn(t.app, p.users.engineer.email, PASSWORD);
  inspector = await signIn(t.app, p.users.inspector.email, PASSWORD);
});
afterAll(() => t.close());

const example = JSON.parse(readFileSync('shared/camber/examples/double-tee-harped.json', 'utf8'));

describe('POST /api/camber/predict', () => {
  it('when an engineer posts the example, then the API returns what the engine computes', async () => {
    const res = await engineer.agent.post('/api/camber/predict').set('X-CSRF-Token', engineer.csrf).send(example);
    expect(res.status).toBe(200);
    expect(res.body).toEqual(JSON.parse(JSON.stringify(predict(example))));
  });
  it('when a field is wrong, then 400 names it', async () => {
    const res = await engineer.agent
      .post('/api/camber/predict')
      .set('X-CSRF-Token', engineer.csrf)
      .send({ ...example, strands: [{ count: 10, area: 0.153, profile: 'harped-2', eccEnd: 4, eccMid: 13 }] });
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors['strands.0.harpAt'][0]).toMatch(/harpAt/);
  });
  it('when an inspector asks, then 403', async () => {
    const res = await inspector.agent.post('/api/camber/predict').set('X-CSRF-Token', inspector.csrf).send(example);
    expect(res.status).toBe(403);
  });
});
