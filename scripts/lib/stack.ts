// The pieces `npm start`, `npm test` and the benchmarks share: the database, the web build, the server process.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { migrateAndSeed } from '../../apps/server/src/db/setup';
import { dropStaleTestDatabases, ensureCluster, ensureDatabase, type ClusterSpec } from './pg';

const TEST_DB_PREFIX = 'splitscope_test_';
import { runInherit, SetupError, waitForHttp } from './proc';

export const root = join(import.meta.dirname, '..', '..');
export const WEB_DIST = join(root, 'apps', 'web', 'dist');

export function clusterSpec(kind: 'main' | 'test'): ClusterSpec {
  const port = Number(process.env.SPLITSCOPE_PG_PORT ?? 54329);
  if (kind === 'main' && !(Number.isInteger(port) && port > 0 && port < 65536)) {
    throw new SetupError(`SPLITSCOPE_PG_PORT must be a TCP port number, not "${process.env.SPLITSCOPE_PG_PORT}"`);
  }
  return {
    root,
    name: kind === 'main' ? 'pg' : 'pg-test',
    port: kind === 'main' ? port : 'auto',
    user: 'splitscope',
    password: process.env.SPLITSCOPE_PG_PASSWORD ?? 'splitscope-local',
    throwaway: kind === 'test',
  };
}

export type AppMode = 'demo' | 'shop';

/** The mode `npm start` runs in: SPLITSCOPE_MODE=shop for a real shop, the demo otherwise. */
export const modeFromEnv = (): AppMode => (process.env.SPLITSCOPE_MODE === 'shop' ? 'shop' : 'demo');

/**
 * Cluster up, database there (recreated for tests), migrations applied, demo seeded in demo mode. A real shop
 * has its own database (`splitscope_shop` unless SPLITSCOPE_DB_NAME says otherwise), so demo rows never meet it.
 * Returns DATABASE_URL.
 */
/**
 * A migrated database. `kind: 'test'` makes a new one per run; `suffix` names a second one for the same run (the
 * browser tests' own demo database, so rows the integration tests leave behind never reach a browser spec).
 */
export async function prepareDatabase(kind: 'main' | 'test', mode: AppMode = 'demo', suffix = ''): Promise<string> {
  const t0 = Date.now();
  const cluster = await ensureCluster(clusterSpec(kind));
  const first = kind === 'test' && mode === 'demo' && !suffix;
  if (first) await dropStaleTestDatabases(cluster, TEST_DB_PREFIX);
  const name =
    kind === 'main'
      ? (process.env.SPLITSCOPE_DB_NAME ?? (mode === 'shop' ? 'splitscope_shop' : 'splitscope'))
      : `${TEST_DB_PREFIX}${process.pid}${mode === 'shop' ? '_shop' : ''}${suffix ? `_${suffix}` : ''}`;
  const url = await ensureDatabase(cluster, name, { recreate: kind === 'test' });
  const { created, seeded } = await migrateAndSeed(url, mode);
  // Lets a developer run one integration test file by hand against the same database.
  if (first) writeFileSync(join(root, '.data', 'test-url'), url + '\n');
  console.log(
    `splitscope: PostgreSQL on 127.0.0.1:${cluster.port} (${cluster.dir}), database ${name} migrated` +
      (!seeded ? ' (shop mode: no demo seed)' : created ? `, demo seeded (${created} users)` : ', demo already seeded') +
      ` in ${Date.now() - t0} ms`,
  );
  return url;
}

function newestMtime(dir: string): number {
  let newest = 0;
  if (!existsSync(dir)) return 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'node_modules' || entry.name.startsWith('dist')) continue;
    const p = join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : statSync(p).mtimeMs);
  }
  return newest;
}

/** Production build of the web app, skipped when nothing it is built from changed since the last build. */
export async function buildWeb(): Promise<void> {
  const stamp = join(WEB_DIST, 'index.html');
  const sources = Math.max(newestMtime(join(root, 'apps', 'web')), newestMtime(join(root, 'packages')));
  if (existsSync(stamp) && statSync(stamp).mtimeMs > sources) {
    console.log('splitscope: web build is up to date');
    return;
  }
  console.log('splitscope: building the web app');
  // Build beside the live folder and swap it in, so a server already serving dist/ never sees half a build.
  const tmp = `${WEB_DIST}-${process.pid}`;
  const code = await runInherit(
    join(root, 'apps', 'web', 'node_modules', '.bin', 'vite'),
    ['build', '--logLevel', 'warn', '--outDir', tmp],
    process.env,
    join(root, 'apps', 'web'),
  );
  if (code !== 0) {
    rmSync(tmp, { recursive: true, force: true });
    throw new SetupError('the web build failed (see above)');
  }
  rmSync(WEB_DIST, { recursive: true, force: true });
  renameSync(tmp, WEB_DIST);
}

export interface ServerProcess {
  url: string;
  child: ChildProcess;
  stop(signal?: NodeJS.Signals): Promise<void>;
}

/** Starts the API server as a child process in its own process group (so a stop ends everything it started). */
export async function spawnServer(env: Record<string, string>, { quiet = false } = {}): Promise<ServerProcess> {
  const port = env.PORT ?? '5180';
  const child = spawn(process.execPath, ['--import', 'tsx', join(root, 'apps', 'server', 'src', 'main.ts')], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'production', WEB_DIST, ...env },
    stdio: quiet ? ['ignore', 'ignore', 'inherit'] : 'inherit',
    detached: true,
  });
  const url = `http://127.0.0.1:${port}`;
  const exited = new Promise<void>((r) => child.once('exit', () => r()));
  const stop = async (signal: NodeJS.Signals = 'SIGTERM') => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    try {
      process.kill(-child.pid!, signal);
    } catch {
      /* already gone */
    }
    await exited;
  };
  try {
    await Promise.race([
      waitForHttp(`${url}/api/health`, 60_000),
      exited.then(() => {
        throw new SetupError('the server exited during start-up (see above)');
      }),
    ]);
  } catch (err) {
    await stop('SIGKILL');
    throw err;
  }
  return { url, child, stop };
}
