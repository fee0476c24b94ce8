import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { forgotSchema, loginSchema, resetSchema } from '#shared/api/auth';
import { ERROR_CODES } from '#shared/api/errors';
import { ROLES } from '#shared/api/roles';
import type { Deps } from '../deps';
import { AppError } from '../http/errors';
import { defineRoute, type RouteDef } from '../http/route';
import { loadSessionUser } from '../users/users.repository';
import { requestReset, resetPassword, signIn } from './auth.service';
import { clearSession, issueSession } from './session';

export function authRoutes(d: Deps): RouteDef[] {
  // Per address and e-mail, so one user's typos do not lock out the yard's shared tablet for everyone.
  const loginLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: d.cfg.LOGIN_LIMIT,
    // Only refused attempts count: a shift of correct sign-ins on a shared tablet never locks it.
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String((req.body as { email?: unknown } | undefined)?.email ?? '').toLowerCase()}`,
    handler: (_req, _res, next) => next(new AppError(429, ERROR_CODES.rateLimited, 'too many sign-in attempts; wait 15 minutes or reset your password')),
  });
  const resetLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: 5 * d.cfg.LOGIN_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new AppError(429, ERROR_CODES.rateLimited, 'too many requests; wait 15 minutes')),
  });

  return [
    defineRoute({
      method: 'post', path: '/auth/login', summary: 'Sign in with e-mail and password', roles: 'public', body: loginSchema, before: [loginLimiter],
      handler: async ({ req, res, body }) => {
        const id = await signIn(d, body.email, body.password).catch((e: unknown) => {
          req.log.info({ event: 'login', outcome: 'failure' }, 'sign-in refused');
          throw e;
        });
        issueSession(d.cfg, req, res, id);
        req.log.info({ event: 'login', outcome: 'success', userId: id }, 'signed in');
        return loadSessionUser(d.ds, id);
      },
    }),
    defineRoute({
      method: 'post', path: '/auth/logout', summary: 'Sign out', roles: ROLES,
      handler: ({ res }) => {
        clearSession(res);
      },
    }),
    defineRoute({ method: 'get', path: '/auth/me', summary: 'The signed-in user', roles: ROLES, handler: ({ user }) => user }),
    defineRoute({
      method: 'post', path: '/auth/forgot', summary: 'E-mail a password reset link', roles: 'public', body: forgotSchema, status: 202, before: [resetLimiter],
      handler: async ({ body }) => {
        await requestReset(d, body.email);
        return { message: 'if the address belongs to an account, a reset link is on its way' };
      },
    }),
    defineRoute({
      method: 'post', path: '/auth/reset', summary: 'Set a new password from an e-mailed link', roles: 'public', body: resetSchema, before: [resetLimiter],
      handler: async ({ req, res, body }) => {
        const id = await resetPassword(d, body.token, body.password);
        issueSession(d.cfg, req, res, id);
        return loadSessionUser(d.ds, id);
      },
    }),
  ];
}
