import type { SessionUser } from '#shared/api/auth';

declare global {
  namespace Express {
    interface Request {
      user?: SessionUser;
      /** The CSRF token bound to the session, from the signed session token. */
      csrf?: string;
    }
  }
}

export {};
