// Fuzzing every write route with malformed and boundary payloads generated from the shared zod contract:
// never a 5xx, and a refused request never changes the database.
import fc from 'fast-check';
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
/** A zod schema; only its internal definition is read, so no zod import is needed here. */
type ZodSchema = object;
import * as contract from '../../packages/contract/src/index';
import { clusterSpec, root } from '../lib/stack';
import { proofDatabase, ServerChild, signIn, type Session } from './env';
import { payloadArb, type FuzzPayload } from './zod-arb';

export interface WriteRoute {
  method: 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  path: string;
  /** The contract schema the route parses its body with, when one is named in the handler. */
  schemaName: string | null;
  file: string;
}

/** Write routes, read from the route files: `r.post('/path', ...)` and the `parse(schema, req.body)` it calls. */
export function findWriteRoutes(): WriteRoute[] {
  const features = join(root, 'apps', 'server', 'src', 'features');
  const appText = readFileSync(join(root, 'apps', 'server', 'src', 'app.ts'), 'utf8');
  const routes: WriteRoute[] = [];
  for (const dir of readdirSync(features)) {
    const folder = join(features, dir);
    if (!existsSync(folder)) continue;
    for (const f of readdirSync(folder).filter((n) => n.endsWith('.ts') && !n.endsWith('.test.ts'))) {
      const text = readFileSync(join(folder, f), 'utf8');
      const defs = [...text.matchAll(/\b\w+\.(post|put|patch|delete)\(\s*'([^']+)'/g)];
      if (defs.length === 0) continue;
      // A router mounted somewhere other than /api is named in app.ts: app.use('/api/x', fooRoutes(ctx)).
      let prefix = '/api';
      for (const [, fn] of text.matchAll(/export function (\w+)\(/g)) {
        const m = appText.match(new RegExp(`app\\.use\\(\\s*'([^']+)'\\s*,\\s*${fn}\\(`));
        if (m) prefix = m[1]!;
      }
      defs.forEach((d, i) => {
        const body = text.slice(d.index, defs[i + 1]?.index ?? text.length);
        const schema = body.match(/parse\(\s*(\w+)\s*,\s*req\.body\s*\)/);
        const path = (prefix + (d[2] === '/' ? '' : d[2]!)).replace(/\/+$/, '') || '/';
        routes.push({ method: d[1]!.toUpperCase() as WriteRoute['method'], path, schemaName: schema?.[1] ?? null, file: `${dir}/${f}` });
      });
    }
  }
  return routes;
}

const ID_TABLES: Record<string, string> = {
  jobs: 'jobs',
  customers: 'customers',
  users: 'users',
  boards: 'board_models',
  quotes: 'quotes',
  invoices: 'invoices',
  readings: 'readings',
};

async function fillParams(path: string, client: pg.Client): Promise<string> {
  const parts = path.split('/');
  for (let i = 0; i < parts.length; i++) {
    if (!parts[i]!.startsWith(':')) continue;
    const table = ID_TABLES[parts[i - 1] ?? ''];
    let id = 'no-such-id';
    if (table) {
      const r = await client.query<{ id: string }>(`SELECT id FROM ${table} ORDER BY id LIMIT 1`).catch(() => null);
      id = r?.rows[0]?.id ?? id;
    }
    parts[i] = encodeURIComponent(id);
  }
  return parts.join('/');
}

/** A fingerprint of every table's contents, to tell a refused request's footprint from autovacuum's. */
async function digest(client: pg.Client): Promise<Map<string, string>> {
  const { rows } = await client.query<{ t: string }>(
    "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY 1",
  );
  const out = new Map<string, string>();
  for (const { t } of rows) {
    const q = `SELECT count(*)::text || ':' || coalesce(md5(string_agg(x::text, '|' ORDER BY x::text)), '') AS d FROM "${t.replace(/"/g, '""')}" x`;
    out.set(t, (await client.query<{ d: string }>(q)).rows[0]!.d);
  }
  return out;
}

const nextXid = async (client: pg.Client) => (await client.query<{ x: string }>('SELECT pg_snapshot_xmax(pg_current_snapshot())::text AS x')).rows[0]!.x;

export interface FuzzReport {
  ok: boolean;
  tried: number;
  routes: number;
  accepted: number;
  refused: number;
  serverErrors: { route: string; status: number; label: string; sample: string }[];
  changes: { route: string; status: number; label: string; tables: string[] }[];
  unmapped: string[];
  statuses: Record<number, number>;
  seconds: number;
}

export async function runFuzz({ total, seed, log }: { total: number; seed?: number; log: (l: string) => void }): Promise<FuzzReport> {
  const t0 = Date.now();
  const routes = findWriteRoutes();
  const db = await proofDatabase(clusterSpec('test'), 'splitscope_fuzz');
  const server = await ServerChild.create(db.url, 'fuzz-server.log', { LOGIN_RATE_LIMIT: '1000000' });
  const client = new pg.Client({ connectionString: db.url });
  const report: FuzzReport = { ok: false, tried: 0, routes: routes.length, accepted: 0, refused: 0, serverErrors: [], changes: [], unmapped: [], statuses: {}, seconds: 0 };
  try {
    await server.start();
    await client.connect();
    const sessions: Record<string, Session> = {
      admin: await signIn(server.url, 'admin@demo.test'),
      tech: await signIn(server.url, 'tech@demo.test'),
    };
    const perRoute = Math.max(50, Math.ceil(total / Math.max(1, routes.length)));
    const schemas = contract as unknown as Record<string, ZodSchema | undefined>;
    let before = await digest(client);
    let xid = await nextXid(client);
    for (const route of routes) {
      const schema = route.schemaName ? schemas[route.schemaName] : undefined;
      if (!schema) report.unmapped.push(`${route.method} ${route.path} (${route.file})`);
      const arb = payloadArb(schema ?? (contract.createReadingRequest as unknown as ZodSchema));
      const samples = fc.sample(arb, { numRuns: perRoute, seed: seed === undefined ? undefined : seed + report.tried });
      const paths = [await fillParams(route.path, client), route.path.replace(/:\w+/g, 'no-such-id')];
      for (const [i, p] of samples.entries()) {
        // Signing out would end the session the rest of the run uses: that route gets none.
        const session = i % 10 === 9 || route.path.endsWith('/auth/sign-out') ? null : i % 2 ? sessions.tech! : sessions.admin!;
        const url = server.url + paths[i % 7 === 6 ? 1 : 0];
        const status = await send(route.method, url, p, session);
        report.tried++;
        report.statuses[status] = (report.statuses[status] ?? 0) + 1;
        const name = `${route.method} ${route.path}`;
        if (status >= 500 || status === 0) {
          if (report.serverErrors.length < 20) report.serverErrors.push({ route: name, status, label: p.label, sample: p.text.slice(0, 300) });
        }
        if (status >= 200 && status < 400) {
          report.accepted++;
          before = await digest(client);
          xid = await nextXid(client);
          continue;
        }
        report.refused++;
        const x = await nextXid(client);
        if (x === xid) continue; // no transaction took an id: nothing was written
        const after = await digest(client);
        const tables = [...after].filter(([t, d]) => before.get(t) !== d).map(([t]) => t);
        if (tables.length && report.changes.length < 20) report.changes.push({ route: name, status, label: p.label, tables });
        before = after;
        xid = x;
      }
      log(`fuzz: ${route.method} ${route.path}: ${samples.length} payloads${schema ? ` from ${route.schemaName}` : ' (no contract schema found)'}`);
    }
    const h = await fetch(`${server.url}/api/health`).catch(() => null);
    if (!h || h.status !== 200) report.serverErrors.push({ route: 'GET /api/health after fuzzing', status: h?.status ?? 0, label: 'health', sample: '' });
  } finally {
    await client.end().catch(() => undefined);
    await server.kill('SIGTERM');
    await db.drop();
  }
  report.seconds = (Date.now() - t0) / 1000;
  report.ok = report.tried > 0 && report.serverErrors.length === 0 && report.changes.length === 0;
  return report;
}

async function send(method: string, url: string, p: FuzzPayload, session: Session | null): Promise<number> {
  const headers: Record<string, string> = {};
  if (p.contentType) headers['content-type'] = p.contentType;
  if (p.contentEncoding) headers['content-encoding'] = p.contentEncoding;
  if (session) headers.cookie = session.cookie;
  try {
    const r = await fetch(url, { method, headers, body: p.text, signal: AbortSignal.timeout(15_000) });
    await r.arrayBuffer();
    return r.status;
  } catch {
    return 0; // no answer at all counts with the server errors
  }
}

export function printFuzzReport(r: FuzzReport, log: (l: string) => void = console.log): void {
  for (const u of r.unmapped) log(`fuzz: note: no contract schema named in ${u}; fuzzed with reading payloads`);
  for (const e of r.serverErrors) log(`fuzz: FAIL ${e.status || 'no answer'} from ${e.route} (${e.label}): ${e.sample}`);
  for (const c of r.changes) log(`fuzz: FAIL refused ${c.status} from ${c.route} (${c.label}) changed ${c.tables.join(', ')}`);
  log(`fuzz: tried ${r.tried} payloads on ${r.routes} write routes (${r.refused} refused, ${r.accepted} accepted) in ${r.seconds.toFixed(1)} s: ${r.serverErrors.length} server errors, ${r.changes.length} refused requests that changed the database`);
  log(`fuzz: answers by status: ${Object.entries(r.statuses).map(([k, v]) => `${k}: ${v}`).join(', ')}`);
  log(r.ok ? 'fuzz: ok' : 'fuzz: FAILED');
}
