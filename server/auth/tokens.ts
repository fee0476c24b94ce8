import { createHash, randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { rowsOf } from '../db/rows';

export const TOKEN_TTL_MS = { reset: 60 * 60_000, invite: 7 * 24 * 60 * 60_000 } as const;

const hashToken = (token: string): string => createHash('sha256').update(token).digest('hex');

/** Creates a single-use e-mail token; only its hash is stored. Returns the token to put in the link. */
export async function createEmailToken(db: DataSource | EntityManager, userId: string, kind: 'reset' | 'invite'): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await db.query(`INSERT INTO auth_token (user_id, kind, token_hash, expires_at) VALUES ($1, $2, $3, $4)`, [
    userId,
    kind,
    hashToken(token),
    new Date(Date.now() + TOKEN_TTL_MS[kind]),
  ]);
  return token;
}

/** Marks the token used and returns its user, or null when unknown, used or expired. */
export async function consumeEmailToken(db: EntityManager, token: string): Promise<{ userId: string; kind: 'reset' | 'invite' } | null> {
  const rows = rowsOf<{ user_id: string; kind: 'reset' | 'invite' }>(
    await db.query(`UPDATE auth_token SET used_at = now() WHERE token_hash = $1 AND used_at IS NULL AND expires_at > now() RETURNING user_id, kind`, [hashToken(token)]),
  );
  const r = rows[0];
  return r ? { userId: r.user_id, kind: r.kind } : null;
}
