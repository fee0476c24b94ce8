import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import type { Mailer } from './mail/mailer';

/** What route factories and services receive: no container, just these. */
export interface Deps {
  ds: DataSource;
  cfg: Config;
  mailer: Mailer;
  log: Logger;
}
