// Starts the real server in-process on a free port against the test database that `npm test` prepared.
import type { Express } from 'express';
import { loadConfig } from '../src/config';
import { startServer, type RunningServer } from '../src/server';

export async function startTestServer(env: Record<string, string> = {}): Promise<RunningServer> {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the integration tests through `npm test`');
  const config = loadConfig({ ...process.env, NODE_ENV: 'test', PORT: '0', LOGIN_RATE_LIMIT: '1000', ...env });
  return startServer(config);
}

/** A tiny HTTP client that keeps one session cookie, like a browser tab. */
export class Client {
  cookie = '';
  constructor(readonly base: string) {}

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}) {
    const res = await fetch(this.base + path, {
      method,
      headers: {
        ...(body !== undefined ? { 'content-type': 'application/json' } : {}),
        ...(this.cookie ? { cookie: this.cookie } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
    });
    const setCookie = res.headers.get('set-cookie');
    if (setCookie) this.cookie = setCookie.split(';')[0]!;
    const text = await res.text();
    let json: unknown;
    try {
      json = text ? JSON.parse(text) : undefined;
    } catch {
      json = text;
    }
    return { status: res.status, headers: res.headers, body: json as Record<string, unknown> & unknown[] };
  }
  get = (path: string) => this.request('GET', path);
  post = (path: string, body?: unknown, headers?: Record<string, string>) => this.request('POST', path, body ?? {}, headers);
  patch = (path: string, body?: unknown) => this.request('PATCH', path, body ?? {});
  put = (path: string, body?: unknown) => this.request('PUT', path, body ?? {});

  async signIn(email: string, password = 'splitscope-demo') {
    const r = await this.post('/api/auth/sign-in', { email, password });
    if (r.status !== 204) throw new Error(`sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`);
    return this;
  }
}

/** A new, migrated, empty database beside the test database (for shop mode); dropped again by `drop`. */
export async function createEmptyDatabase(name: string): Promise<{ url: string; drop(): Promise<void> }> {
  const { default: pg } = await import('pg');
  const { createDatabase } = await import('../src/db/client');
  const { runMigrations } = await import('../src/db/migrate');
  const base = process.env.DATABASE_URL!;
  const admin = new pg.Client({ connectionString: base });
  await admin.connect();
  const quoted = `"${name.replace(/"/g, '""')}"`;
  await admin.query(`DROP DATABASE IF EXISTS ${quoted} WITH (FORCE)`);
  await admin.query(`CREATE DATABASE ${quoted}`);
  const url = base.replace(/\/[^/?]+(\?|$)/, `/${name}$1`);
  const { db, pool } = createDatabase(url, 2);
  await runMigrations(db);
  await pool.end();
  return {
    url,
    drop: async () => {
      await admin.query(`DROP DATABASE IF EXISTS ${quoted} WITH (FORCE)`);
      await admin.end();
    },
  };
}

/** Serves an app built with another configuration (createApp) on a free port until `close`. */
export async function listenApp(app: Express): Promise<{ url: string; close(): void }> {
  const listening = app.listen(0, '127.0.0.1');
  await new Promise((ok) => listening.once('listening', ok));
  const { port } = listening.address() as { port: number };
  return { url: `http://127.0.0.1:${port}`, close: () => listening.close() };
}
