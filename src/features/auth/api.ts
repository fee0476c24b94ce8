import { queryOptions } from '@tanstack/react-query';
import { sessionUserSchema, type LoginInput, type SessionUser } from '#shared/api/auth';
import { api, ApiFailure } from '../../lib/api';

const ME_KEY = 'cw-me';

/**
 * The signed-in user. Without a connection the last known user answers, so the yard screens open
 * offline; the server still checks every reading when it is sent.
 */
export const meQuery = queryOptions({
  queryKey: ['me'],
  queryFn: async (): Promise<SessionUser | null> => {
    try {
      const me = await api('/auth/me', { schema: sessionUserSchema });
      localStorage.setItem(ME_KEY, JSON.stringify(me));
      return me;
    } catch (e) {
      if (e instanceof ApiFailure && e.status === 401) {
        localStorage.removeItem(ME_KEY);
        return null;
      }
      if (e instanceof ApiFailure && e.status === 0) {
        const kept = sessionUserSchema.safeParse(JSON.parse(localStorage.getItem(ME_KEY) ?? 'null'));
        if (kept.success) return kept.data;
      }
      throw e;
    }
  },
  staleTime: 60_000,
  networkMode: 'always',
});

export const rememberMe = (me: SessionUser): void => localStorage.setItem(ME_KEY, JSON.stringify(me));
export const forgetMe = (): void => localStorage.removeItem(ME_KEY);

export const signIn = (input: LoginInput): Promise<SessionUser> => api('/auth/login', { method: 'POST', body: input, schema: sessionUserSchema });
export const signOut = (): Promise<void> => api('/auth/logout', { method: 'POST' });
export const requestReset = (email: string): Promise<{ message: string }> => api('/auth/forgot', { method: 'POST', body: { email } });
export const resetPassword = (token: string, password: string): Promise<SessionUser> =>
  api('/auth/reset', { method: 'POST', body: { token, password }, schema: sessionUserSchema });
