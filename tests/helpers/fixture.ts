import type { Role } from '#shared/api/roles';
import { signIn, testApp, type Session, type TestApp } from './app';
import { buildPlantWithUsers, PASSWORD } from './factories';

export type PlantWithUsers = Awaited<ReturnType<typeof buildPlantWithUsers>>;

/** The set-up most API test files share: the app on the test database, a plant with one user of every role, and one of them signed in. */
export async function appWithPlant(role: Role): Promise<{ t: TestApp; plant: PlantWithUsers; session: Session }> {
  const t = await testApp();
  const plant = await buildPlantWithUsers(t.ds);
  return { t, plant, session: await signIn(t.app, plant.users[role].email, PASSWORD) };
}
