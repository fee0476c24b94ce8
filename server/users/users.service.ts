import type { InviteInput, UpdateUserInput, UserRow } from '#shared/api/users';
import type { SessionUser } from '#shared/api/auth';
import { audit } from '../audit/audit.service';
import { createEmailToken } from '../auth/tokens';
import type { Deps } from '../deps';
import { AppError, conflict, notFound } from '../http/errors';
import { escapeHtml } from '../mail/mailer';
import { listUsers } from './users.repository';

export async function inviteUser(d: Deps, admin: SessionUser, input: InviteInput): Promise<UserRow> {
  if (input.jobId) {
    const jobs: unknown[] = await d.ds.query(`SELECT 1 FROM job WHERE id = $1 AND plant_id = $2`, [input.jobId, admin.plantId]);
    if (jobs.length === 0) throw new AppError(400, 'validation_failed', 'that job is not one of this plant', { jobId: ['not a job of this plant'] });
  }
  const { id, token } = await d.ds.transaction(async (tx) => {
    const exists: unknown[] = await tx.query(`SELECT 1 FROM app_user WHERE lower(email) = lower($1)`, [input.email]);
    if (exists.length) throw conflict('a user with this e-mail already exists');
    const rows: Array<{ id: string }> = await tx.query(
      `INSERT INTO app_user (plant_id, email, name, role, job_id) VALUES ($1, $2, $3, $4, $5) RETURNING id`,
      [admin.plantId, input.email, input.name, input.role, input.role === 'viewer' ? input.jobId : null],
    );
    const newId = rows[0]!.id;
    const t = await createEmailToken(tx, newId, 'invite');
    await audit(tx, { plantId: admin.plantId, userId: admin.id, action: 'invite', entity: 'user', entityId: newId, after: { email: input.email, role: input.role } });
    return { id: newId, token: t };
  });
  const link = `${d.cfg.publicUrl}/reset-password?token=${token}&invite=1`;
  await d.mailer.send({
    to: input.email,
    subject: `You are invited to Crownwatch at ${admin.plantName}`,
    text: `Hello ${input.name},\n\n${admin.name} invited you to Crownwatch, the camber record of ${admin.plantName}.\nChoose your password within 7 days:\n${link}\n`,
    html: `<p>Hello ${escapeHtml(input.name)},</p><p>${escapeHtml(admin.name)} invited you to Crownwatch, the camber record of ${escapeHtml(admin.plantName)}.</p><p><a href="${escapeHtml(link)}">Choose your password</a> (the link works for 7 days).</p>`,
  });
  const all = await listUsers(d.ds, admin.plantId);
  return all.find((u) => u.id === id)!;
}

export async function updateUser(d: Deps, admin: SessionUser, id: string, input: UpdateUserInput): Promise<UserRow> {
  if (id === admin.id && (input.active === false || (input.role && input.role !== 'admin'))) {
    throw new AppError(400, 'validation_failed', 'you cannot remove your own administrator access', { role: ['not on your own account'] });
  }
  await d.ds.transaction(async (tx) => {
    const rows: Array<{ role: string; active: boolean }> = await tx.query(`SELECT role, active FROM app_user WHERE id = $1 AND plant_id = $2 FOR UPDATE`, [id, admin.plantId]);
    const before = rows[0];
    if (!before) throw notFound('the user');
    await tx.query(`UPDATE app_user SET role = coalesce($2, role), active = coalesce($3, active), updated_at = now() WHERE id = $1`, [id, input.role ?? null, input.active ?? null]);
    await audit(tx, { plantId: admin.plantId, userId: admin.id, action: 'update', entity: 'user', entityId: id, before, after: input });
  });
  // The notification reaches every process; this one must not serve the old role even for a moment.
  d.sessions?.forget();
  const all = await listUsers(d.ds, admin.plantId);
  return all.find((u) => u.id === id)!;
}
