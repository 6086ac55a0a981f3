import type Database from 'better-sqlite3';
import type { Env } from './config/env';
import type { Db } from './db/client';
import type { Mailer } from './mail/mailer';
import type { ScryptParams } from './auth/password';
import type { WorkerPool } from './workers/pool';

export interface Logger {
  info(msg: string): void;
  error(msg: string, err?: unknown): void;
}

// Everything the app needs from the outside, passed in so tests build it with their own pieces.
export interface AppDeps {
  env: Env;
  db: Db;
  sqlite: Database.Database;
  mailer: Mailer;
  sessionSecret: Uint8Array;
  scrypt: ScryptParams;
  log: Logger;
  version: string;
  /** Worker threads for CPU-heavy jobs (traces, spreadsheets, certificate PDFs). */
  workers: WorkerPool;
}
