import type { Server } from 'node:http';
import { createApp } from './app';
import { createAuth } from './auth/lucia';
import { inArray } from 'drizzle-orm';
import { ConfigError, type Config } from './config';
import { shops } from './db/schema';
import { createDatabase } from './db/client';
import type { AppContext } from './context';
import { holdDiagnosisPool, releaseDiagnosisPool } from './features/diagnosis/pool';
import { enableDictionaryBuilds, ensureOpenJobDictionaries } from './features/diagnosis/dictionary';
import { upgradeBoardDocuments, type UpgradeOutcome } from './features/boards/upgrade';
import { DiskStorage } from './storage/storage';

export interface RunningServer {
  /** What the start-time board-document upgrade did (main.ts prints it). */
  upgrade: UpgradeOutcome;
  ctx: AppContext;
  server: Server;
  url: string;
  close(): Promise<void>;
}

/** Starts the HTTP server on the configured host and port (port 0 picks a free one). */
export async function startServer(config: Config): Promise<RunningServer> {
  const { db, pool } = createDatabase(config.DATABASE_URL, config.DB_POOL_SIZE);
  if (config.SPLITSCOPE_MODE === 'shop') {
    // The demo's people sign in with a published password: a real shop never runs on a database that has them.
    const demo = await db
      .select({ id: shops.id })
      .from(shops)
      .where(inArray(shops.id, ['shop-demo', 'shop-other']));
    if (demo.length) {
      await pool.end();
      throw new ConfigError(
        'SPLITSCOPE_MODE=shop, but this database holds the demo shop; give the real shop its own database (DATABASE_URL or SPLITSCOPE_DB_NAME)',
      );
    }
  }
  const secureCookies = config.PUBLIC_URL?.startsWith('https://') ?? false;
  const ctx: AppContext = { config, db, pool, auth: createAuth(db, { secureCookies }), storage: new DiskStorage(config.UPLOAD_DIR) };
  // Stored board documents of an older schema version are rewritten before the first request reads one.
  const upgrade = await upgradeBoardDocuments(ctx);
  const app = createApp(ctx);
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.PORT, config.HOST, () => resolve(s));
    s.once('error', reject);
  });
  // Test servers come and go by the dozen; each starting diagnosis threads it may never use would cost seconds.
  holdDiagnosisPool(config.DIAGNOSIS_WORKERS, { warm: config.NODE_ENV !== 'test' });
  // Fault dictionaries are built on publish; at start only those of versions open jobs use and that lack one (a
  // minute of a core per board: docs/decisions/0007). `pnpm dictionary:build` builds the rest. A version is usable
  // at once meanwhile.
  if (config.NODE_ENV !== 'test' && config.FAULT_DICTIONARIES) {
    enableDictionaryBuilds(true);
    void ensureOpenJobDictionaries(db).catch((err: unknown) => console.error(`splitscope: fault dictionaries not started: ${(err as Error).message}`));
  }
  // Idle keep-alive sockets outlive the clients' own idle timeouts (browsers, proxies, test runners), so the
  // server never closes a socket at the moment a client reuses it (seen as ECONNRESET). Node's default is 5 s.
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : config.PORT;
  return {
    upgrade,
    ctx,
    server,
    url: `http://${config.HOST}:${port}`,
    close: async () => {
      await new Promise<void>((r) => server.close(() => r()));
      await releaseDiagnosisPool();
      await pool.end();
    },
  };
}
