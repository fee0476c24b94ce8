import type { DataSource } from 'typeorm';
import { ERROR_CODES } from '#shared/api/errors';
import type { Config } from '../config';
import { audit } from '../audit/audit.service';
import { rowsOf } from '../db/rows';
import { AppError } from '../http/errors';
import { escapeHtml, type Mailer } from '../mail/mailer';
import { hashPassword, verifyPassword } from './password';
import { consumeEmailToken, createEmailToken } from './tokens';

export interface AuthDeps { ds: DataSource; cfg: Config; mailer: Mailer }

/** Checks e-mail and password; returns the user id. The message does not say which of the two was wrong. */
export async function signIn(d: AuthDeps, email: string, password: string): Promise<string> {
  const rows: Array<{ id: string; password_hash: string | null; active: boolean }> = await d.ds.query(
    `SELECT id, password_hash, active FROM app_user WHERE lower(email) = lower($1)`,
    [email],
  );
  const u = rows[0];
  const ok = await verifyPassword(password, u?.password_hash ?? null);
  if (!u || !ok || !u.active || !u.password_hash) throw new AppError(401, ERROR_CODES.unauthenticated, 'the e-mail or the password is wrong');
  return u.id;
}

/** Sends a reset link when the address belongs to an active user; says nothing either way. */
export async function requestReset(d: AuthDeps, email: string): Promise<void> {
  const rows: Array<{ id: string; name: string }> = await d.ds.query(
    `SELECT id, name FROM app_user WHERE lower(email) = lower($1) AND active AND password_hash IS NOT NULL`,
    [email],
  );
  const u = rows[0];
  if (!u) return;
  const token = await createEmailToken(d.ds, u.id, 'reset');
  const link = `${d.cfg.publicUrl}/reset-password?token=${token}`;
  await d.mailer.send({
    to: email,
    subject: 'Reset your Crownwatch password',
    text: `Hello ${u.name},\n\nOpen this link within one hour to choose a new password:\n${link}\n\nIf you did not ask for this, ignore this e-mail.`,
    html: `<p>Hello ${escapeHtml(u.name)},</p><p><a href="${escapeHtml(link)}">Choose a new password</a> (the link works once, for one hour).</p><p>If you did not ask for this, ignore this e-mail.</p>`,
  });
}

/** Sets the password from a reset or invitation token; the token works once. */
export async function resetPassword(d: AuthDeps, token: string, password: string): Promise<string> {
  const hash = await hashPassword(password, d.cfg.BCRYPT_COST);
  return d.ds.transaction(async (tx) => {
    const t = await consumeEmailToken(tx, token);
    if (!t) throw new AppError(400, 'token_invalid', 'this link has expired or was already used; ask for a new one', { token: ['expired or already used'] });
    const rows = rowsOf<{ plant_id: string }>(await tx.query(`UPDATE app_user SET password_hash = $2, updated_at = now() WHERE id = $1 RETURNING plant_id`, [t.userId, hash]));
    await audit(tx, { plantId: rows[0]?.plant_id ?? null, userId: t.userId, action: t.kind === 'invite' ? 'accept-invite' : 'reset-password', entity: 'user', entityId: t.userId });
    return t.userId;
  });
}
