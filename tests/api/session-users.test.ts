import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, testApp, type TestApp, type Session } from '../helpers/app';
import { buildPlantWithUsers, PASSWORD } from '../helpers/factories';

// The signed-in user kept in memory between requests (server/auth/session-users), emptied on the change
// notifications of migration SessionUserNotify, and not used while nobody listens for them.
let t: TestApp;
let plant: Awaited<ReturnType<typeof buildPlantWithUsers>>;
let qc: Session;
const LISTENER = `session-users-test-${process.pid}`;

beforeAll(async () => {
  // The listening connection carries a name of this file's own, so the test can cut it.
  t = await testApp({}, { sessionCache: true, listenerName: LISTENER });
  plant = await buildPlantWithUsers(t.ds);
  qc = await signIn(t.app, plant.users.qc_manager.email, PASSWORD);
});
afterAll(() => t.close());

const nameNow = async (): Promise<string> => (await qc.agent.get('/api/auth/me').expect(200)).body.name;

/** Renames the user with the change notification switched off for this one transaction (the database owner may). */
async function renameUnnoticed(name: string): Promise<void> {
  await t.ds.transaction(async (tx) => {
    await tx.query(`SET LOCAL session_replication_role = replica`);
    await tx.query(`UPDATE app_user SET name = $2 WHERE id = $1`, [plant.users.qc_manager.id, name]);
  });
}

async function until(check: () => Promise<boolean>, what: string): Promise<void> {
  for (let i = 0; i < 100; i++) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`still waiting for ${what} after 5 s`);
}

describe('who a session belongs to, kept between requests', () => {
  it('when the user is read again, then it comes from memory; when a change is committed, then the next requests see it', async () => {
    expect(t.deps.sessions?.listening).toBe(true);
    const before = await nameNow();
    await renameUnnoticed('Renamed unnoticed');
    expect(await nameNow()).toBe(before); // served from memory: the database changed without a notification
    await t.ds.query(`UPDATE app_user SET name = 'Renamed with notice' WHERE id = $1`, [plant.users.qc_manager.id]);
    await until(async () => (await nameNow()) === 'Renamed with notice', 'the notified change');
  });

  it('when a plant changes, then its users are read afresh', async () => {
    await nameNow();
    await t.ds.query(`UPDATE plant SET time_zone = 'America/Denver' WHERE id = $1`, [plant.plantId]);
    await until(async () => (await qc.agent.get('/api/auth/me')).body.timeZone === 'America/Denver', 'the plant change');
  });

  it('when the listening connection is cut, then every request reads the user until it listens again', async () => {
    await nameNow();
    const [cut] = await t.ds.query(`SELECT count(pg_terminate_backend(pid))::int AS n FROM pg_stat_activity WHERE application_name = $1`, [LISTENER]);
    expect(cut.n).toBe(1);
    await until(async () => t.deps.sessions?.listening === false, 'the cut to be noticed');
    await renameUnnoticed('Read while deaf');
    expect(await nameNow()).toBe('Read while deaf');
    await until(async () => t.deps.sessions?.listening === true, 'listening again');
    await nameNow();
    await renameUnnoticed('Unnoticed again');
    expect(await nameNow()).toBe('Read while deaf'); // in memory once more
  });
});
