import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { ERROR_CODES } from '#shared/api/errors';
import { authRoutes } from './auth/auth.routes';
import { sessionMiddleware } from './auth/session';
import { uncachedSessionUsers } from './auth/session-users';
import { camberRoutes } from './camber/camber.routes';
import { ROOT } from './config';
import type { Deps } from './deps';
import { AppError, errorMiddleware } from './http/errors';
import { mountRoutes, type RouteDef } from './http/route';
import { pieceRoutes } from './pieces/pieces.routes';
import { readingRoutes } from './readings/readings.routes';
import { systemRoutes } from './system.routes';
import { userRoutes } from './users/users.routes';
import { yardRoutes } from './yard/yard.routes';
import { reviewRoutes } from './review/review.routes';
import { boardRoutes } from './board/board.routes';
import { bayRoutes } from './bays/bays.routes';
import { shippingRoutes } from './shipping/shipping.routes';
import { reportRoutes } from './reports/reports.routes';
import { importRoutes } from './imports/imports.routes';
import { exportRoutes } from './exports/exports.routes';
import { settingsRoutes } from './settings/settings.routes';
import { designRoutes } from './designs/designs.routes';

export const CLIENT_DIR = resolve(ROOT, '.build', 'client');

/** The whole route table: the API, the OpenAPI document and the role matrix test all read it. */
export function buildRoutes(d: Deps): RouteDef[] {
  const table: RouteDef[] = [];
  table.push(...authRoutes(d), ...userRoutes(d), ...pieceRoutes(d), ...readingRoutes(d), ...yardRoutes(d), ...reviewRoutes(d), ...boardRoutes(d), ...bayRoutes(d), ...shippingRoutes(d), ...reportRoutes(d), ...importRoutes(d), ...exportRoutes(d), ...settingsRoutes(d), ...designRoutes(d), ...camberRoutes(), ...systemRoutes(d, () => table));
  return table;
}

export function createApp(d: Deps, clientDir: string | null = CLIENT_DIR): Express {
  const app = express();
  app.disable('x-powered-by');
  app.use(
    helmet({
      // Plain HTTP on a plant intranet must still load its own assets (helmet issues #429/#480).
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          // The QR reader compiles its WebAssembly module; nothing else is evaluated.
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
          'media-src': ["'self'", 'blob:'],
          'upgrade-insecure-requests': null,
        },
      },
      strictTransportSecurity: d.cfg.NODE_ENV === 'production',
    }),
  );
  // A request log line costs a child logger and a serialised request per request (about a fifth of a
  // signed-in read's CPU, measured); with logging off only the request id is kept.
  if (d.log.isLevelEnabled('info')) {
    app.use(
      pinoHttp({
        logger: d.log,
        genReqId: (_req, res) => {
          const id = randomUUID();
          res.setHeader('X-Request-Id', id);
          return id;
        },
        customProps: (req) => ({ userId: req.user?.id, role: req.user?.role }),
        autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
      }),
    );
  } else {
    app.use((req, res, next) => {
      req.id = randomUUID();
      req.log = d.log;
      res.setHeader('X-Request-Id', req.id);
      next();
    });
  }
  const api = express.Router();
  // API answers carry the plant's QC record, often on shared yard tablets: never stored by a browser or
  // proxy (OWASP Session Management Cheat Sheet, "Web Content Caching"). With nothing stored there is
  // nothing to revalidate, so no ETag is computed over every body (a hash of the whole answer per request).
  app.set('etag', false);
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: '256kb' }));
  api.use(cookieParser());
  api.use(sessionMiddleware(d.cfg, d.sessions ?? uncachedSessionUsers(d.ds)));
  mountRoutes(api, buildRoutes(d));
  api.use((req, _res, next) => next(new AppError(404, ERROR_CODES.notFound, `no API route ${req.method} ${req.path}`)));
  app.use('/api', api);

  if (clientDir && existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // The client routes in the browser: every other GET gets the app shell.
    app.get(/^\/(?!api\/).*/, (_req, res) => res.sendFile('index.html', { root: clientDir }));
  }
  app.use(errorMiddleware);
  return app;
}
