import pino, { type Logger } from 'pino';

/** JSON log lines; secrets never reach the log (ASVS 7.1.1). */
export function createLogger(level: string): Logger {
  return pino({
    level,
    redact: {
      paths: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]', 'password', '*.password', 'token', '*.token'],
      censor: '[REDACTED]',
    },
  });
}
