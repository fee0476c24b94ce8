import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import { ERROR_CODES, type ApiError } from '#shared/api/errors';

/** The one error type services throw; the middleware below turns it into the API error shape. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fieldErrors?: Record<string, string[]>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what: string): AppError => new AppError(404, ERROR_CODES.notFound, `${what} was not found`);
export const forbidden = (message = 'your role may not do this'): AppError => new AppError(403, ERROR_CODES.forbidden, message);
export const unauthenticated = (message = 'sign in first'): AppError => new AppError(401, ERROR_CODES.unauthenticated, message);
export const conflict = (message: string, extra?: Record<string, unknown>): AppError => new AppError(409, ERROR_CODES.conflict, message, undefined, extra);

/** Zod issues as `{ "field.path": [messages] }`, the shape forms use to place errors under fields. */
export function fieldErrorsOf(err: ZodError, prefix?: string): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of err.issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || '_';
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

interface PgError { code?: string; detail?: string }
interface BodyParserError { type?: string; status?: number }

export const errorMiddleware: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = String(req.id ?? '');
  const send = (status: number, body: ApiError & Record<string, unknown>): void => {
    res.status(status).json({ ...body, requestId });
  };
  if (err instanceof AppError) return send(err.status, { code: err.code, message: err.message, fieldErrors: err.fieldErrors, ...err.extra });
  if (err instanceof ZodError) {
    return send(400, { code: ERROR_CODES.validation, message: 'some fields are not valid', fieldErrors: fieldErrorsOf(err) });
  }
  const multerCode = (err as { code?: string; name?: string }).name === 'MulterError' ? (err as { code: string }).code : null;
  if (multerCode === 'LIMIT_FILE_SIZE') return send(413, { code: 'payload_too_large', message: 'the file is larger than 5 MB', fieldErrors: { photo: ['larger than 5 MB'] } });
  if (multerCode) return send(400, { code: ERROR_CODES.validation, message: `the upload was refused: ${(err as Error).message}` });
  const bp = err as BodyParserError;
  if (bp.type === 'entity.too.large') return send(413, { code: 'payload_too_large', message: 'the request body is too large' });
  if (bp.type === 'entity.parse.failed') return send(400, { code: ERROR_CODES.validation, message: 'the request body is not valid JSON' });
  if (bp.type && bp.status && bp.status < 500) return send(bp.status, { code: ERROR_CODES.validation, message: 'the request body could not be read' });
  const httpStatus = (err as { status?: number }).status;
  if (httpStatus && httpStatus >= 400 && httpStatus < 500) {
    return send(httpStatus, { code: httpStatus === 404 ? ERROR_CODES.notFound : ERROR_CODES.validation, message: httpStatus === 404 ? 'not found' : 'the request could not be handled' });
  }
  const pgErr = err as PgError;
  if (pgErr.code === '23505') return send(409, { code: ERROR_CODES.conflict, message: 'a record with the same key already exists' });
  if (pgErr.code === '22P02' || pgErr.code === '22021') return send(400, { code: ERROR_CODES.validation, message: 'a value has the wrong form' });
  // Connection failures: SQLSTATE class 08, shutdown 57P01–57P03, a refused or reset socket, or the
  // driver's "Connection terminated" (node-postgres gives that one no code, so its text is the signal).
  const driver = (err as { driverError?: PgError & { message?: string } }).driverError ?? pgErr;
  const lost =
    ['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', '57P01', '57P02', '57P03'].includes(driver.code ?? '') ||
    (driver.code ?? '').startsWith('08') ||
    /Connection terminated|timeout exceeded when trying to connect/.test((driver as { message?: string }).message ?? '');
  if (lost) {
    return send(503, { code: ERROR_CODES.unavailable, message: 'the database is not reachable; try again shortly' });
  }
  req.log?.error({ err }, 'unhandled error');
  send(500, { code: ERROR_CODES.internal, message: `something went wrong on our side; quote ${requestId} when reporting it` });
};
