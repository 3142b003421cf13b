// Fuzzing every route, reads and writes, as every role, with well-formed, malformed and boundary payloads generated
// from the shared zod contract (with the ids of real rows and the patterns the schemas name):
// never a 5xx, a refused request never changes the database, and an accepted one changes what its answer says.
import fc from 'fast-check';
import { createHmac } from 'node:crypto';
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
/** A zod schema; only its internal definition is read, so no zod import is needed here. */
type ZodSchema = object;
import * as contract from '../../packages/contract/src/index';
import { clusterSpec, root } from '../lib/stack';
import { proofDatabase, ServerChild, signIn, type Session } from './env';
import { payloadArb, realIds, type FuzzPayload } from './zod-arb';

export interface WriteRoute {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  path: string;
  /** The contract schema the route parses its body with, when one is named in the handler. */
  schemaName: string | null;
  file: string;
}

/** Routes, read from the route files: `r.post('/path', ...)` and the `parse(schema, req.body)` (or `req.query` for a GET) it calls. */
export function findWriteRoutes(): WriteRoute[] {
  const features = join(root, 'apps', 'server', 'src', 'features');
  const appText = readFileSync(join(root, 'apps', 'server', 'src', 'app.ts'), 'utf8');
  const routes: WriteRoute[] = [];
  for (const dir of readdirSync(features)) {
    const folder = join(features, dir);
    if (!existsSync(folder)) continue;
    for (const f of readdirSync(folder).filter((n) => n.endsWith('.ts') && !n.endsWith('.test.ts'))) {
      const text = readFileSync(join(folder, f), 'utf8');
      const defs = [...text.matchAll(/\b\w+\.(get|post|put|patch|delete)\(\s*'([^']+)'/g)];
      if (defs.length === 0) continue;
      // A router mounted somewhere other than /api is named in app.ts: app.use('/api/x', fooRoutes(ctx)).
      let prefix = '/api';
      for (const [, fn] of text.matchAll(/export function (\w+)\(/g)) {
        const m = appText.match(new RegExp(`app\\.use\\(\\s*'([^']+)'\\s*,\\s*${fn}\\(`));
        if (m) prefix = m[1]!;
      }
      defs.forEach((d, i) => {
        const body = text.slice(d.index, defs[i + 1]?.index ?? text.length);
        const schema = body.match(d[1] === 'get' ? /parse\(\s*(\w+)\s*,\s*req\.query\s*\)/ : /parse\(\s*(\w+)\s*,\s*req\.body\s*\)/);
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
  /** Accepted requests whose effect on the database was not what their answer says (a GET that wrote, a 201 that stored nothing). */
  stateErrors: { route: string; status: number; label: string; problem: string }[];
  perRoute: Record<string, { accepted: number; refused: number }>;
  unmapped: string[];
  statuses: Record<number, number>;
  seconds: number;
}

// What a refused or read-only request may still write, by design: a failed sign-in is audited, a session is
// extended when used, billing settings are created with their defaults on first read, a customer link notes its use.
const REFUSED_MAY_WRITE: Record<string, string[]> = { 'POST /api/auth/sign-in': ['audit_log'] };
const READS_MAY_WRITE = ['sessions', 'billing_settings', 'customer_links'];

const WEBHOOK_SECRET = `whsec_fuzz_${process.pid}`;
/** A payment-service signature over the exact bytes (t=…,v1=HMAC-SHA256 of "t.payload"), as the webhook checks. */
const signWebhook = (payload: string) => {
  const t = Math.floor(Date.now() / 1000);
  return `t=${t},v1=${createHmac('sha256', WEBHOOK_SECRET).update(`${t}.${payload}`).digest('hex')}`;
};

/** Ids of real rows for the body fields that name them, so payloads reach past "no such customer". */
async function loadRealIds(client: pg.Client): Promise<void> {
  const ids = async (q: string) => (await client.query<{ id: string }>(q)).rows.map((r) => r.id);
  realIds.customerId = await ids("SELECT id FROM customers WHERE shop_id = 'shop-demo'");
  realIds.boardId = await ids("SELECT id FROM board_models WHERE shop_id = 'shop-demo'");
  realIds.assigneeId = await ids("SELECT id FROM users WHERE shop_id = 'shop-demo'");
  realIds.jobId = await ids("SELECT id FROM jobs WHERE shop_id = 'shop-demo'");
  realIds.quoteId = await ids("SELECT id FROM quotes WHERE shop_id = 'shop-demo'");
  realIds.supersedes = await ids("SELECT id FROM readings WHERE shop_id = 'shop-demo' LIMIT 20");
  // test point labels of the demo boards for the probes (red/black), beside the net names
  realIds.red = ['TP1', 'TP2', 'TP3', 'TP4', 'TP5', 'TP6', 'gnd', '0'];
  realIds.black = ['0', 'gnd', 'TP1'];
}

const rowCounts = (d: Map<string, string>) => new Map([...d].map(([t, v]) => [t, Number(v.split(':')[0])]));

export async function runFuzz({ total, seed, log }: { total: number; seed?: number; log: (l: string) => void }): Promise<FuzzReport> {
  const t0 = Date.now();
  const routes = findWriteRoutes();
  const db = await proofDatabase(clusterSpec('test'), 'splitscope_fuzz');
  const server = await ServerChild.create(db.url, 'fuzz-server.log', { LOGIN_RATE_LIMIT: '1000000', PAYMENTS_WEBHOOK_SECRET: WEBHOOK_SECRET });
  const client = new pg.Client({ connectionString: db.url });
  const report: FuzzReport = { ok: false, tried: 0, routes: routes.length, accepted: 0, refused: 0, serverErrors: [], changes: [], stateErrors: [], perRoute: {}, unmapped: [], statuses: {}, seconds: 0 };
  try {
    await server.start();
    await client.connect();
    // every role of the demo shop, a technician of the other shop, and nobody
    const people = ['admin@demo.test', 'lead@demo.test', 'tech@demo.test', 'trainee@demo.test', 'tech@other.test', null];
    const sessions: (Session | null)[] = await Promise.all(people.map((e) => (e ? signIn(server.url, e) : null)));
    // A fuzzed "sign out everywhere" or a role change ends a session the run still uses: sign in again.
    const renew = async (k: number) => {
      const email = people[k];
      if (email) sessions[k] = await signIn(server.url, email).catch(() => null);
    };
    await loadRealIds(client);
    const perRoute = Math.max(50, Math.ceil(total / Math.max(1, routes.length)));
    const schemas = contract as unknown as Record<string, ZodSchema | undefined>;
    let before = await digest(client);
    let xid = await nextXid(client);
    for (const route of routes) {
      const name = `${route.method} ${route.path}`;
      const stats = (report.perRoute[name] = { accepted: 0, refused: 0 });
      const schema = route.schemaName ? schemas[route.schemaName] : undefined;
      if (!schema && route.method !== 'GET') report.unmapped.push(`${name} (${route.file})`);
      const arb = payloadArb(schema ?? (route.method === 'GET' ? contract.idParams : contract.createReadingRequest) as unknown as ZodSchema);
      const samples = fc.sample(arb, { numRuns: perRoute, seed: seed === undefined ? undefined : seed + report.tried });
      const paths = [await fillParams(route.path, client), route.path.replace(/:\w+/g, 'no-such-id')];
      for (const [i, p] of samples.entries()) {
        // Signing out would end the session the rest of the run uses: that route gets none.
        const k = i % sessions.length;
        const session = route.path.endsWith('/auth/sign-out') ? null : sessions[k]!;
        const url = server.url + paths[i % 7 === 6 ? 1 : 0];
        const status = await send(route.method, url, p, session, route.path.includes('/webhooks/'));
        if (status === 401 && session) await renew(k);
        report.tried++;
        report.statuses[status] = (report.statuses[status] ?? 0) + 1;
        if (status >= 500 || status === 0) {
          if (report.serverErrors.length < 20) report.serverErrors.push({ route: name, status, label: p.label, sample: p.text.slice(0, 300) });
        }
        const x = await nextXid(client);
        const wrote = x !== xid;
        const after = wrote ? await digest(client) : before;
        const changed = [...after].filter(([t, d]) => before.get(t) !== d).map(([t]) => t);
        if (status >= 200 && status < 400) {
          report.accepted++;
          stats.accepted++;
          // State assertions: a read writes nothing of substance, and a 201 stored a row somewhere.
          const stray = route.method === 'GET' ? changed.filter((t) => !READS_MAY_WRITE.includes(t)) : [];
          if (stray.length && report.stateErrors.length < 20) report.stateErrors.push({ route: name, status, label: p.label, problem: `a read changed ${stray.join(', ')}` });
          if (status === 201) {
            const was = rowCounts(before);
            const grew = [...rowCounts(after)].some(([t, n]) => n > (was.get(t) ?? 0));
            if (!grew && report.stateErrors.length < 20) report.stateErrors.push({ route: name, status, label: p.label, problem: '201 Created but no table has a new row' });
          }
        } else {
          report.refused++;
          stats.refused++;
          const allowed = REFUSED_MAY_WRITE[name] ?? [];
          const tables = changed.filter((t) => !allowed.includes(t) && !(route.method === 'GET' && READS_MAY_WRITE.includes(t)));
          if (tables.length && report.changes.length < 20) report.changes.push({ route: name, status, label: p.label, tables });
        }
        before = after;
        xid = x;
      }
      log(`fuzz: ${name}: ${stats.accepted} accepted, ${stats.refused} refused of ${samples.length}${schema ? ` from ${route.schemaName}` : ' (no contract schema found)'}`);
    }
    const h = await fetch(`${server.url}/api/health`).catch(() => null);
    if (!h || h.status !== 200) report.serverErrors.push({ route: 'GET /api/health after fuzzing', status: h?.status ?? 0, label: 'health', sample: '' });
  } finally {
    await client.end().catch(() => undefined);
    await server.kill('SIGTERM');
    await db.drop();
  }
  report.seconds = (Date.now() - t0) / 1000;
  report.ok = report.tried > 0 && report.serverErrors.length === 0 && report.changes.length === 0 && report.stateErrors.length === 0;
  return report;
}

async function send(method: string, url: string, p: FuzzPayload, session: Session | null, signed: boolean): Promise<number> {
  const headers: Record<string, string> = {};
  if (signed) headers['stripe-signature'] = signWebhook(p.text);
  if (p.contentType) headers['content-type'] = p.contentType;
  if (p.contentEncoding) headers['content-encoding'] = p.contentEncoding;
  if (session) headers.cookie = session.cookie;
  try {
    // A GET carries its payload as the query string (the route parses req.query).
    const query = method === 'GET' ? queryOf(p.text) : '';
    const r = await fetch(url + query, { method, headers, body: method === 'GET' ? undefined : p.text, signal: AbortSignal.timeout(15_000) });
    await r.arrayBuffer();
    return r.status;
  } catch {
    return 0; // no answer at all counts with the server errors
  }
}

/** A JSON object payload as `?k=v&…` (nested values as JSON text); anything else as one raw parameter. */
function queryOf(text: string): string {
  let v: unknown;
  try {
    v = JSON.parse(text);
  } catch {
    return `?q=${encodeURIComponent(text)}`;
  }
  if (!v || typeof v !== 'object' || Array.isArray(v)) return `?q=${encodeURIComponent(String(text))}`;
  const params = new URLSearchParams();
  for (const [k, x] of Object.entries(v)) params.append(k, typeof x === 'string' ? x : JSON.stringify(x));
  return `?${params}`;
}

export function printFuzzReport(r: FuzzReport, log: (l: string) => void = console.log): void {
  for (const u of r.unmapped) log(`fuzz: note: no contract schema named in ${u}; fuzzed with reading payloads`);
  for (const e of r.serverErrors) log(`fuzz: FAIL ${e.status || 'no answer'} from ${e.route} (${e.label}): ${e.sample}`);
  for (const c of r.changes) log(`fuzz: FAIL refused ${c.status} from ${c.route} (${c.label}) changed ${c.tables.join(', ')}`);
  for (const e of r.stateErrors) log(`fuzz: FAIL accepted ${e.status} from ${e.route} (${e.label}): ${e.problem}`);
  log('fuzz: accepted / refused per route:');
  for (const [route, s] of Object.entries(r.perRoute)) log(`  ${route.padEnd(52)} ${String(s.accepted).padStart(5)} / ${String(s.refused).padStart(5)}  (${Math.round((100 * s.accepted) / Math.max(1, s.accepted + s.refused))} % accepted)`);
  log(`fuzz: tried ${r.tried} payloads on ${r.routes} routes (${r.refused} refused, ${r.accepted} accepted) in ${r.seconds.toFixed(1)} s: ${r.serverErrors.length} server errors, ${r.changes.length} refused requests that changed the database, ${r.stateErrors.length} accepted requests with the wrong effect`);
  log(`fuzz: answers by status: ${Object.entries(r.statuses).map(([k, v]) => `${k}: ${v}`).join(', ')}`);
  log(r.ok ? 'fuzz: ok' : 'fuzz: FAILED');
}
