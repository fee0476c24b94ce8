// The session is a short-lived JWT (HS256 pinned on both sign and verify) in an httpOnly, SameSite=Strict
// cookie. The token carries a random CSRF value that is also set in a readable cookie; state-changing
// requests must echo it in the X-CSRF-Token header (double submit bound to the signed session), so a
// page on another origin cannot forge one.
import { createSecretKey, type KeyObject, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import jwt from 'jsonwebtoken';
import { ERROR_CODES } from '#shared/api/errors';
import type { SessionUser } from '#shared/api/auth';
import type { Config } from '../config';
import { AppError } from '../http/errors';
import type { SessionUsers } from './session-users';

export const SESSION_COOKIE = 'cw_session';
export const CSRF_COOKIE = 'cw_csrf';
export const CSRF_HEADER = 'x-csrf-token';
const ALGORITHM = 'HS256' as const;
const ISSUER = 'crownwatch';
const AUDIENCE = 'crownwatch-web';
/** Re-issue the token when it is older than this, so an active user is not signed out mid-shift. */
const RENEW_AFTER_S = 10 * 60;

interface Claims { sub: string; csrf: string; iat: number; exp: number }

/**
 * The secret as a KeyObject, made once. Given a string, jsonwebtoken first tries to read it as a public
 * key (a failed PEM parse that throws) on every call; profiling showed that as most of a request's CPU.
 */
const keys = new Map<string, KeyObject>();
function keyOf(secret: string): KeyObject {
  let key = keys.get(secret);
  if (!key) keys.set(secret, (key = createSecretKey(Buffer.from(secret))));
  return key;
}

function cookieOptions(cfg: Config, req: Request, httpOnly: boolean) {
  const secure = cfg.COOKIE_SECURE === 'auto' ? req.secure : cfg.COOKIE_SECURE === 'true';
  return { httpOnly, secure, sameSite: 'strict' as const, path: '/', maxAge: cfg.SESSION_MINUTES * 60_000 };
}

export function issueSession(cfg: Config, req: Request, res: Response, userId: string, csrf = randomBytes(24).toString('base64url')): void {
  const token = jwt.sign({ csrf }, keyOf(cfg.jwtSecret), { algorithm: ALGORITHM, subject: userId, issuer: ISSUER, audience: AUDIENCE, expiresIn: cfg.SESSION_MINUTES * 60 });
  res.cookie(SESSION_COOKIE, token, cookieOptions(cfg, req, true));
  res.cookie(CSRF_COOKIE, csrf, cookieOptions(cfg, req, false));
}

export function clearSession(res: Response): void {
  res.clearCookie(SESSION_COOKIE, { path: '/' });
  res.clearCookie(CSRF_COOKIE, { path: '/' });
}

/**
 * Tokens already verified, per secret and by their exact text (the same text carries the same
 * signature): a session sends the same token for up to ten minutes, and checking its signature again is
 * a needless HMAC and JSON parse per request. The expiry is still checked on every use.
 */
const verifiedBySecret = new Map<string, Map<string, Claims>>();
const MAX_VERIFIED = 10_000;

function verify(cfg: Config, token: string): Claims | null {
  let verified = verifiedBySecret.get(cfg.jwtSecret);
  if (!verified) verifiedBySecret.set(cfg.jwtSecret, (verified = new Map()));
  const known = verified.get(token);
  if (known) {
    if (known.exp * 1000 > Date.now()) return known;
    verified.delete(token);
    return null;
  }
  try {
    const claims = jwt.verify(token, keyOf(cfg.jwtSecret), { algorithms: [ALGORITHM], issuer: ISSUER, audience: AUDIENCE }) as Claims;
    if (verified.size >= MAX_VERIFIED) verified.clear();
    verified.set(token, claims);
    return claims;
  } catch {
    return null;
  }
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Reads the session cookie into req.user; enforces CSRF on state-changing requests of a session. */
export function sessionMiddleware(cfg: Config, sessions: SessionUsers): RequestHandler {
  return async (req, res, next) => {
    const token = req.cookies?.[SESSION_COOKIE] as string | undefined;
    if (!token) return next();
    const claims = verify(cfg, token);
    if (!claims) {
      clearSession(res);
      return next();
    }
    const user: SessionUser | null = await sessions.get(claims.sub);
    if (!user) {
      clearSession(res);
      return next();
    }
    if (!SAFE_METHODS.has(req.method)) {
      const sent = req.get(CSRF_HEADER) ?? '';
      const a = Buffer.from(sent);
      const b = Buffer.from(claims.csrf);
      if (a.length !== b.length || !timingSafeEqual(a, b)) {
        return next(new AppError(403, ERROR_CODES.csrf, 'the request is missing its CSRF token; reload the page and try again'));
      }
    }
    req.user = user;
    req.csrf = claims.csrf;
    if (Date.now() / 1000 - claims.iat > RENEW_AFTER_S) issueSession(cfg, req, res, user.id, claims.csrf);
    next();
  };
}
