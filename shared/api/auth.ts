import { z } from 'zod';
import { roleSchema } from './roles';

export const emailSchema = z.string().trim().toLowerCase().email('enter a valid e-mail address').max(254);

// bcrypt reads at most 72 bytes of a password; longer ones would be silently cut, so we refuse them.
export const passwordSchema = z
  .string()
  .min(10, 'use at least 10 characters')
  .refine((p) => new TextEncoder().encode(p).length <= 72, 'a password can be at most 72 bytes (about 72 letters, fewer with accents or emoji)');

export const loginSchema = z.object({ email: emailSchema, password: z.string().min(1, 'enter your password').max(1000) });
export type LoginInput = z.infer<typeof loginSchema>;

export const forgotSchema = z.object({ email: emailSchema });
export const resetSchema = z.object({ token: z.string().min(20).max(200), password: passwordSchema });

export const sessionUserSchema = z.object({
  id: z.string().uuid(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  plantId: z.string().uuid(),
  plantName: z.string(),
  unitSystem: z.enum(['us', 'si']),
  timeZone: z.string(),
  jobId: z.string().uuid().nullable(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;
