import { queryOptions } from '@tanstack/react-query';
import { sessionUserSchema, type LoginInput, type SessionUser } from '#shared/api/auth';
import { api, ApiFailure } from '../../lib/api';

export const meQuery = queryOptions({
  queryKey: ['me'],
  queryFn: async (): Promise<SessionUser | null> => {
    try {
      return await api('/auth/me', { schema: sessionUserSchema });
    } catch (e) {
      if (e instanceof ApiFailure && e.status === 401) return null;
      throw e;
    }
  },
  staleTime: 60_000,
});

export const signIn = (input: LoginInput): Promise<SessionUser> => api('/auth/login', { method: 'POST', body: input, schema: sessionUserSchema });
export const signOut = (): Promise<void> => api('/auth/logout', { method: 'POST' });
export const requestReset = (email: string): Promise<{ message: string }> => api('/auth/forgot', { method: 'POST', body: { email } });
export const resetPassword = (token: string, password: string): Promise<SessionUser> =>
  api('/auth/reset', { method: 'POST', body: { token, password }, schema: sessionUserSchema });
