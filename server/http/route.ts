import type { Request, RequestHandler, Response, Router } from 'express';
import type { z, ZodType } from 'zod';
import { ERROR_CODES } from '#shared/api/errors';
import type { SessionUser } from '#shared/api/auth';
import type { Role } from '#shared/api/roles';
import { JsonText } from '../db/json-sql';
import { AppError, fieldErrorsOf, forbidden, unauthenticated } from './errors';

/** What a `:id` in the path names, so the plant-isolation test can point it at another plant's data. */
export type Resource = 'piece' | 'user' | 'design' | 'reading' | 'job' | 'import';

export interface RouteContext<B, Q, P> {
  req: Request;
  res: Response;
  user: SessionUser;
  body: B;
  query: Q;
  params: P;
}

export interface RouteDef<B = unknown, Q = unknown, P = unknown> {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  summary: string;
  roles: readonly Role[] | 'public';
  resource?: Resource;
  body?: ZodType<B>;
  query?: ZodType<Q>;
  params?: ZodType<P>;
  response?: ZodType;
  status?: number;
  before?: RequestHandler[];
  /** The handler sends the response itself (files, redirects). */
  raw?: boolean;
  handler: (ctx: RouteContext<B, Q, P>) => Promise<unknown> | unknown;
}

/** Keeps the generic types of one route while the table holds many. */
export const defineRoute = <B = undefined, Q = undefined, P = undefined>(r: RouteDef<B, Q, P>): RouteDef => r as unknown as RouteDef;

function parse<T>(schema: ZodType<T> | undefined, value: unknown, where: string): T {
  if (!schema) return undefined as T;
  const r = schema.safeParse(value);
  if (!r.success) {
    throw new AppError(400, ERROR_CODES.validation, `some ${where} fields are not valid`, fieldErrorsOf(r.error as z.ZodError, where === 'body' ? undefined : where));
  }
  return r.data;
}

/** Mounts the route table: role check, zod validation of params, query and body, then the handler. */
export function mountRoutes(router: Router, routes: RouteDef[]): void {
  for (const r of routes) {
    // The role is checked before anything else runs, uploads included.
    const guard: RequestHandler = (req, _res, next) => {
      if (r.roles === 'public') return next();
      if (!req.user) return next(unauthenticated());
      if (!r.roles.includes(req.user.role)) return next(forbidden());
      next();
    };
    const handler: RequestHandler = async (req, res) => {
      const user = req.user ?? null;
      const params = parse(r.params, req.params, 'path');
      const query = parse(r.query, req.query, 'query');
      const body = parse(r.body, req.body ?? {}, 'body');
      const result = await r.handler({ req, res, user: user as SessionUser, body, query, params });
      if (r.raw) return;
      if (result === undefined) res.status(r.status ?? 204).end();
      else if (result instanceof JsonText) res.status(r.status ?? 200).type('application/json').send(result.text);
      else res.status(r.status ?? 200).json(result);
    };
    router[r.method](r.path, guard, ...(r.before ?? []), handler);
  }
}
