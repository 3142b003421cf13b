// The pieces the proof runs share: their own databases, a server child they may SIGKILL, a signed-in client.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createWriteStream, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { migrateAndSeed } from '../../apps/server/src/db/setup';
import { ensureCluster, ensureDatabase, removeStaleClusters, type Cluster, type ClusterSpec } from '../lib/pg';
import { findFreePort } from '../lib/proc';
import { clusterSpec, root, WEB_DIST } from '../lib/stack';

export const reportsDir = join(root, '.data', 'reports');

/**
 * The fault run stops and restarts its PostgreSQL, so each run gets a cluster of its own (`pg-faults-<pid>`):
 * restarting a shared cluster would break another test run on the same machine. Unlike the test cluster it
 * keeps fsync and synchronous commit on, like the shop's cluster, so what it proves about acknowledged writes
 * holds there too. Clusters left by runs that were killed are removed first.
 */
export function proofClusterSpec(kind: 'pg-faults' | 'pg-bench'): ClusterSpec {
  const base = { ...clusterSpec('test'), name: kind, throwaway: false };
  removeStaleClusters(base, `${kind}-`);
  return { ...base, name: `${kind}-${process.pid}` };
}

export interface ProofDatabase {
  cluster: Cluster;
  spec: ClusterSpec;
  url: string;
  drop(): Promise<void>;
}

/** A fresh, migrated and seeded database named after this process; `drop()` removes it. */
export async function proofDatabase(spec: ClusterSpec, prefix: string): Promise<ProofDatabase> {
  const cluster = await ensureCluster(spec);
  const name = `${prefix}_${process.pid}`;
  const url = await ensureDatabase(cluster, name, { recreate: true });
  await migrateAndSeed(url);
  return {
    cluster,
    spec,
    url,
    drop: async () => {
      const c = new pg.Client({ connectionString: cluster.url('postgres'), connectionTimeoutMillis: 5000 });
      try {
        await c.connect();
        await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      } catch {
        /* the cluster may be restarting; the next run recreates the database anyway */
      } finally {
        await c.end().catch(() => undefined);
      }
    },
  };
}

export const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** The API server as a child process group; unlike `spawnServer` it may be killed and started again. */
export class ServerChild {
  child: ChildProcess | null = null;
  readonly url: string;
  starts = 0;
  private constructor(
    private readonly port: number,
    private readonly env: Record<string, string>,
    private readonly logFile: string,
  ) {
    this.url = `http://127.0.0.1:${port}`;
  }

  static async create(databaseUrl: string, logName: string, extra: Record<string, string> = {}): Promise<ServerChild> {
    mkdirSync(reportsDir, { recursive: true });
    const port = await findFreePort(5400 + (process.pid % 400));
    // Without the local fakes the server refuses published payment secrets; these runs make no payment, so a
    // random pair per run satisfies the check without weakening it.
    const secrets = { PAYMENTS_SECRET_KEY: `sk_test_${randomBytes(12).toString('hex')}`, PAYMENTS_WEBHOOK_SECRET: `whsec_${randomBytes(16).toString('hex')}` };
    const env = { DATABASE_URL: databaseUrl, PORT: String(port), LOGIN_RATE_LIMIT: '1000', NODE_ENV: 'production', WEB_DIST, ...secrets, ...extra };
    return new ServerChild(port, env, join(reportsDir, logName));
  }

  /** Starts the server and waits until it answers HTTP at all (a 503 from /api/health counts: the DB may be down). */
  async start(timeoutMs = 60_000): Promise<void> {
    const log = createWriteStream(this.logFile, { flags: this.starts === 0 ? 'w' : 'a' });
    const child = spawn(process.execPath, ['--import', 'tsx', join(root, 'apps', 'server', 'src', 'main.ts')], {
      cwd: root,
      env: { ...process.env, ...this.env },
      stdio: ['ignore', 'pipe', 'pipe'],
      detached: true,
    });
    child.stdout?.pipe(log);
    child.stderr?.pipe(log);
    this.child = child;
    this.starts++;
    const end = Date.now() + timeoutMs;
    while (Date.now() < end) {
      if (child.exitCode !== null) throw new Error(`the server exited during start-up (exit ${child.exitCode}); see ${this.logFile}`);
      try {
        await fetch(`${this.url}/api/health`, { signal: AbortSignal.timeout(2000) });
        return;
      } catch {
        await sleep(100);
      }
    }
    await this.kill('SIGKILL');
    throw new Error(`the server did not answer within ${timeoutMs / 1000} s; see ${this.logFile}`);
  }

  async kill(signal: NodeJS.Signals = 'SIGKILL'): Promise<void> {
    const child = this.child;
    if (!child || child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise<void>((r) => child.once('exit', () => r()));
    try {
      process.kill(-child.pid!, signal);
    } catch {
      /* already gone */
    }
    await Promise.race([exited, sleep(10_000)]);
  }
}

export interface Session {
  cookie: string;
}

export async function signIn(baseUrl: string, email: string, password = 'splitscope-demo'): Promise<Session> {
  const r = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
    signal: AbortSignal.timeout(10_000),
  });
  if (r.status !== 204) throw new Error(`sign-in as ${email} answered ${r.status}: ${await r.text()}`);
  const cookie = (r.headers.getSetCookie?.() ?? [])
    .map((c) => c.split(';')[0])
    .filter(Boolean)
    .join('; ');
  if (!cookie) throw new Error(`sign-in as ${email} set no cookie`);
  return { cookie };
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i]!;
}

export const machineSize = async () => {
  const os = await import('node:os');
  return `${os.cpus().length} cores, ${Math.round(os.totalmem() / 2 ** 30)} GB`;
};

/** The 1, 5 and 15 minute load averages, printed beside a figure measured on a shared machine. */
export const loadAverage = async () =>
  (await import('node:os'))
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(' ');
