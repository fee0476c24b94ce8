import type { ZodType } from 'zod';
import type { ApiError } from '#shared/api/errors';

/** A failed API call, carrying the server's error shape. */
export class ApiFailure extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiError,
  ) {
    super(body.message);
  }
  get fieldErrors(): Record<string, string[]> {
    return this.body.fieldErrors ?? {};
  }
}

const readCookie = (name: string): string | undefined =>
  document.cookie
    .split('; ')
    .find((c) => c.startsWith(`${name}=`))
    ?.slice(name.length + 1);

interface Options<T> {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  schema?: ZodType<T>;
  headers?: Record<string, string>;
}

/** Fetches JSON from the API; sends the CSRF token on writes; throws ApiFailure with the error shape. */
export async function api<T>(path: string, o: Options<T> = {}): Promise<T> {
  const method = o.method ?? 'GET';
  const headers: Record<string, string> = { Accept: 'application/json', ...o.headers };
  if (o.body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = readCookie('cw_csrf') ?? '';
  let res: Response;
  try {
    res = await fetch(`/api${path}`, { method, headers, body: o.body === undefined ? undefined : JSON.stringify(o.body), credentials: 'same-origin' });
  } catch {
    throw new ApiFailure(0, { code: 'offline', message: 'no connection to the server' });
  }
  if (res.status === 204) return undefined as T;
  const data: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const body = (data ?? { code: 'http_error', message: `the server answered ${res.status}` }) as ApiError;
    throw new ApiFailure(res.status, body);
  }
  return o.schema ? o.schema.parse(data) : (data as T);
}

/** Uploads a file as multipart form data, with the CSRF header; same error shape as `api`. */
export async function upload(path: string, field: string, file: Blob, filename: string): Promise<void> {
  const form = new FormData();
  form.append(field, file, filename);
  let res: Response;
  try {
    res = await fetch(`/api${path}`, { method: 'POST', body: form, headers: { 'X-CSRF-Token': readCookie('cw_csrf') ?? '' }, credentials: 'same-origin' });
  } catch {
    throw new ApiFailure(0, { code: 'offline', message: 'no connection to the server' });
  }
  if (!res.ok) {
    const body = ((await res.json().catch(() => null)) ?? { code: 'http_error', message: `the server answered ${res.status}` }) as ApiError;
    throw new ApiFailure(res.status, body);
  }
}

/** A random key for idempotent writes; works outside secure contexts too. */
export function newIdempotencyKey(): string {
  const b = crypto.getRandomValues(new Uint8Array(16));
  return Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');
}
