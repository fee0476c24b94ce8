import bcrypt from 'bcryptjs';

/** bcrypt hash; the zod password schema has already refused anything over bcrypt's 72-byte limit. */
export const hashPassword = (password: string, cost: number): Promise<string> => bcrypt.hash(password, cost);

// Compared against when the e-mail is unknown, so a wrong e-mail takes as long as a wrong password.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password-000', 10);

export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  if (new TextEncoder().encode(password).length > 72) return false;
  return bcrypt.compare(password, hash ?? DUMMY_HASH);
}
