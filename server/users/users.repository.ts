import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '#shared/api/auth';
import { preparedRows } from '../db/prepared';
import type { UserRow } from '#shared/api/users';

/** The signed-in user with their plant, or null when unknown or deactivated. */
export async function loadSessionUser(db: DataSource | EntityManager, userId: string): Promise<SessionUser | null> {
  // Every signed-in request runs this one: a prepared statement.
  const rows = await preparedRows(
    db,
    `SELECT u.id, u.email, u.name, u.role, u.plant_id, u.job_id, p.name AS plant_name, p.unit_system, p.time_zone
       FROM app_user u JOIN plant p ON p.id = u.plant_id
      WHERE u.id = $1 AND u.active AND u.password_hash IS NOT NULL`,
    [userId],
  );
  const r = rows[0];
  if (!r) return null;
  return {
    id: String(r.id),
    email: String(r.email),
    name: String(r.name),
    role: r.role as SessionUser['role'],
    plantId: String(r.plant_id),
    plantName: String(r.plant_name),
    unitSystem: r.unit_system as 'us' | 'si',
    timeZone: String(r.time_zone),
    jobId: (r.job_id as string | null) ?? null,
  };
}

export async function listUsers(db: DataSource, plantId: string): Promise<UserRow[]> {
  const rows: Array<Record<string, unknown>> = await db.query(
    `SELECT id, email, name, role, active, password_hash IS NULL AS invited, job_id FROM app_user WHERE plant_id = $1 ORDER BY lower(name)`,
    [plantId],
  );
  return rows.map((r) => ({
    id: String(r.id),
    email: String(r.email),
    name: String(r.name),
    role: r.role as UserRow['role'],
    active: Boolean(r.active),
    invited: Boolean(r.invited),
    jobId: (r.job_id as string | null) ?? null,
  }));
}
