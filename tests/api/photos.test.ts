import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Session, TestApp } from '../helpers/app';
import { appWithPlant, type PlantWithUsers } from '../helpers/fixture';
import { buildReading } from '../helpers/factories';

let t: TestApp;
let plant: PlantWithUsers;
let inspector: Session;
beforeAll(async () => ({ t, plant, session: inspector } = await appWithPlant('inspector')));
afterAll(() => t.close());

// The smallest valid PNG: 1×1 pixel.
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=', 'base64');

describe('/api/readings/:id/photo', () => {
  it('when a photo is attached twice (a retried upload), then it is stored once and served back', async () => {
    const r = await buildReading(t.ds, plant.plantId, plant.piece.id, plant.users.inspector.id);
    const first = await inspector.agent.post(`/api/readings/${r.id}/photo`).set('X-CSRF-Token', inspector.csrf).attach('photo', PNG, 'tape.png');
    expect(first.status).toBe(201);
    const again = await inspector.agent.post(`/api/readings/${r.id}/photo`).set('X-CSRF-Token', inspector.csrf).attach('photo', PNG, 'tape.png');
    expect(again.status).toBe(200);
    const got = await inspector.agent.get(`/api/readings/${r.id}/photo`);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(got.body as Buffer, PNG)).toBe(0);
    const detail = await inspector.agent.get(`/api/pieces/${plant.piece.id}`);
    expect(detail.body.readings.find((x: { id: string }) => x.id === r.id).hasPhoto).toBe(true);
  });
  it('when the file is not an image, then 400 says which types are taken', async () => {
    const r = await buildReading(t.ds, plant.plantId, plant.piece.id, plant.users.inspector.id);
    const res = await inspector.agent.post(`/api/readings/${r.id}/photo`).set('X-CSRF-Token', inspector.csrf).attach('photo', Buffer.from('<svg onload=alert(1)>'), { filename: 'x.png', contentType: 'image/png' });
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.photo[0]).toMatch(/JPEG, PNG or WebP/);
  });
  it('when the file is larger than 5 MB, then 413', async () => {
    const r = await buildReading(t.ds, plant.plantId, plant.piece.id, plant.users.inspector.id);
    const big = Buffer.concat([PNG, Buffer.alloc(5 * 1024 * 1024)]);
    const res = await inspector.agent.post(`/api/readings/${r.id}/photo`).set('X-CSRF-Token', inspector.csrf).attach('photo', big, 'big.png');
    expect(res.status).toBe(413);
  });
  it('when no file is sent, then 400 names the photo field', async () => {
    const r = await buildReading(t.ds, plant.plantId, plant.piece.id, plant.users.inspector.id);
    const res = await inspector.agent.post(`/api/readings/${r.id}/photo`).set('X-CSRF-Token', inspector.csrf).field('note', 'x');
    expect(res.status).toBe(400);
    expect(res.body.fieldErrors.photo).toBeDefined();
  });
});
