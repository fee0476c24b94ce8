import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config';

export interface Mail { to: string; subject: string; text: string; html?: string }
export interface Mailer { send(mail: Mail): Promise<void> }

/** SMTP through nodemailer: the local fake mail server in development and tests, any SMTP in production. */
export function createMailer(cfg: Config): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host: cfg.SMTP_HOST,
    port: cfg.SMTP_PORT,
    secure: cfg.SMTP_SECURE === 'true',
    ignoreTLS: cfg.SMTP_SECURE !== 'true' && cfg.NODE_ENV !== 'production',
    auth: cfg.SMTP_USER ? { user: cfg.SMTP_USER, pass: cfg.SMTP_PASSWORD ?? '' } : undefined,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: cfg.MAIL_FROM, ...mail });
    },
  };
}

/** Escapes text for an HTML mail body. */
export const escapeHtml = (s: string): string =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
