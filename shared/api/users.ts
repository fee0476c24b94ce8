import { z } from 'zod';
import { emailSchema } from './auth';
import { roleSchema } from './roles';

export const userRowSchema = z.object({
  id: z.string().uuid(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  active: z.boolean(),
  invited: z.boolean(),
  jobId: z.string().uuid().nullable(),
});
export type UserRow = z.infer<typeof userRowSchema>;

export const inviteSchema = z.object({
  email: emailSchema,
  name: z.string().trim().min(1, 'enter a name').max(120),
  role: roleSchema,
  jobId: z.string().uuid().optional(),
}).refine((v) => v.role !== 'viewer' || v.jobId !== undefined, { path: ['jobId'], message: 'a viewer is invited to one job' });
export type InviteInput = z.infer<typeof inviteSchema>;

export const updateUserSchema = z.object({ role: roleSchema.optional(), active: z.boolean().optional() })
  .refine((v) => v.role !== undefined || v.active !== undefined, { message: 'nothing to change' });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;
