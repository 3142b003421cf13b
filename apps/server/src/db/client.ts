import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;

export interface Database {
  pool: pg.Pool;
  db: Db;
}

/** One pool per process. A lost connection is not fatal: pg drops the client and the next query reconnects. */
export function createDatabase(url: string, max = 20): Database {
  const pool = new pg.Pool({ connectionString: url, max, connectionTimeoutMillis: 3000, idleTimeoutMillis: 30_000 });
  pool.on('error', () => {
    /* an idle client died (database restarted); the pool replaces it on the next checkout */
  });
  return { pool, db: drizzle(pool, { schema }) };
}

/** The pool behind a handle from `createDatabase` (not a transaction's), for the few statements written in SQL. */
export const poolOf = (db: Db): pg.Pool => (db as Db & { $client: pg.Pool }).$client;
