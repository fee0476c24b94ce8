import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import type { SessionUsers } from './auth/session-users';
import type { Mailer } from './mail/mailer';

/** The background work the API asks for; kept in PostgreSQL by pg-boss. */
export interface Jobs {
  projectPiece(pieceId: string, delaySeconds?: number): Promise<void>;
  /** Queues every active piece (of a plant), projected as of `asOf` (now by default). */
  projectAll(plantId?: string, asOf?: Date): Promise<number>;
  alertDigest(plantId: string): Promise<void>;
}

/** What route factories and services receive: no container, just these. */
export interface Deps {
  ds: DataSource;
  cfg: Config;
  mailer: Mailer;
  log: Logger;
  jobs?: Jobs;
  /** Who a session's user is; without it every request reads the user afresh. */
  sessions?: SessionUsers;
}
