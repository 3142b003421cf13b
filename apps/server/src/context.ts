import type pg from 'pg';
import type { Auth } from './auth/lucia';
import type { Config } from './config';
import type { Db } from './db/client';
import type { Storage } from './storage/storage';

/** What every route factory receives: configuration and the shared resources of the process. */
export interface AppContext {
  config: Config;
  db: Db;
  pool: pg.Pool;
  auth: Auth;
  /** Uploaded pictures (disk under UPLOAD_DIR by default). */
  storage: Storage;
}
