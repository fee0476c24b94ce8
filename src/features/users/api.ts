import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { userRowSchema, type InviteInput, type UpdateUserInput, type UserRow } from '#shared/api/users';
import { api } from '../../lib/api';

export const usersQuery = queryOptions({ queryKey: ['users'], queryFn: () => api('/users', { schema: z.array(userRowSchema) }) });
export const inviteUser = (input: InviteInput): Promise<UserRow> => api('/users', { method: 'POST', body: input, schema: userRowSchema });
export const updateUser = (id: string, input: UpdateUserInput): Promise<UserRow> => api(`/users/${id}`, { method: 'PATCH', body: input, schema: userRowSchema });
