import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { Role } from '#shared/api/roles';
import { DEMO_DESIGNS } from '#seed/designs';

export const PASSWORD = 'correct horse battery';
// One hash for every test user: bcrypt at cost 10 per user would dominate the suite's time.
const HASH = bcrypt.hashSync(PASSWORD, 10);

const tag = (): string => randomUUID().slice(0, 8);

export async function buildPlant(ds: DataSource, o: { unitSystem?: 'us' | 'si' } = {}): Promise<{ id: string; code: string }> {
  const code = `T-${tag()}`;
  const [row] = await ds.query(`INSERT INTO plant (name, code, time_zone, unit_system) VALUES ($1, $2, 'America/Chicago', $3) RETURNING id`, [`Test plant ${code}`, code, o.unitSystem ?? 'us']);
  return { id: row.id, code };
}

export async function buildUser(ds: DataSource, plantId: string, role: Role, o: { jobId?: string; active?: boolean; email?: string } = {}): Promise<{ id: string; email: string }> {
  const email = o.email ?? `${role}-${tag()}@test.example`;
  const [row] = await ds.query(`INSERT INTO app_user (plant_id, email, name, role, password_hash, job_id, active) VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`, [plantId, email, `Test ${role}`, role, HASH, o.jobId ?? null, o.active ?? true]);
  return { id: row.id, email };
}

export async function buildJob(ds: DataSource, plantId: string): Promise<{ id: string; number: string }> {
  const number = `J-${tag()}`;
  const [row] = await ds.query(`INSERT INTO job (plant_id, number, name) VALUES ($1, $2, 'Test job') RETURNING id`, [plantId, number]);
  return { id: row.id, number };
}

export async function buildDesign(ds: DataSource, plantId: string, code = 'DT28-60'): Promise<{ id: string }> {
  const d = DEMO_DESIGNS.find((x) => x.code === code)!;
  const [row] = await ds.query(`INSERT INTO member_design (plant_id, code, name, product_type, spec) VALUES ($1, $2, $3, $4, $5) RETURNING id`, [plantId, `${d.code}-${tag()}`, d.name, d.productType, JSON.stringify(d.spec)]);
  return { id: row.id };
}

export async function buildPiece(ds: DataSource, plantId: string, o: { jobId?: string; designId?: string; mark?: string; status?: string; castDate?: string } = {}): Promise<{ id: string; mark: string; jobId: string }> {
  const jobId = o.jobId ?? (await buildJob(ds, plantId)).id;
  const designId = o.designId ?? (await buildDesign(ds, plantId)).id;
  const mark = o.mark ?? `DT-${tag()}`;
  const cast = o.castDate ?? '2026-10-01';
  const [row] = await ds.query(
    `INSERT INTO piece (plant_id, job_id, design_id, mark, cast_date, release_date, ship_date, status) VALUES ($1, $2, $3, $4, $5, ($5::date + 1), ($5::date + 60), $6) RETURNING id`,
    [plantId, jobId, designId, mark, cast, o.status ?? 'in_storage'],
  );
  return { id: row.id, mark, jobId };
}

/** A plant with one user of every role and a piece, ready for requests. */
export async function buildReading(ds: DataSource, plantId: string, pieceId: string, takenBy: string, o: { valueMm?: number; takenAt?: string; sky?: string } = {}): Promise<{ id: string }> {
  const [row] = await ds.query(
    `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, sky, taken_by, idempotency_key, request_hash)
     VALUES ($1, $2, $3, $4, $5, 'mm', 'level', 'dunnage', $6, $7, $8, 'factory') RETURNING id`,
    [plantId, pieceId, o.takenAt ?? new Date().toISOString(), o.valueMm ?? 30, `${o.valueMm ?? 30} mm`, o.sky ?? null, takenBy, `f-${randomUUID()}`],
  );
  return { id: row.id };
}

export async function buildPlantWithUsers(ds: DataSource): Promise<{ plantId: string; users: Record<Role, { id: string; email: string }>; piece: { id: string; mark: string; jobId: string }; reading: { id: string } }> {
  const plant = await buildPlant(ds);
  const piece = await buildPiece(ds, plant.id);
  const users = {
    inspector: await buildUser(ds, plant.id, 'inspector'),
    qc_manager: await buildUser(ds, plant.id, 'qc_manager'),
    engineer: await buildUser(ds, plant.id, 'engineer'),
    admin: await buildUser(ds, plant.id, 'admin'),
    viewer: await buildUser(ds, plant.id, 'viewer', { jobId: piece.jobId }),
  };
  const reading = await buildReading(ds, plant.id, piece.id, users.inspector.id);
  return { plantId: plant.id, users, piece, reading };
}
