// Fuzzing every route, reads and writes, as every role, with well-formed, malformed and boundary payloads generated
// from the shared zod contract (with the ids of real rows and the patterns the schemas name):
// never a 5xx, a refused request never changes the database, and an accepted one changes what its answer says.
import fc from 'fast-check';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
/** A zod schema; only its internal definition is read, so no zod import is needed here. */
type ZodSchema = object;
import * as contract from '../../packages/contract/src/index';
import { clusterSpec, root } from '../lib/stack';
import { proofDatabase, ServerChild, signIn, type Session } from './env';
import { findFreePort } from '../lib/proc';
import { installWriteLog, settledWrites, takeWrites } from './write-log';
import { payloadArb, payloadArbOf, realIds } from './zod-arb';
import { smallPicture } from '../../apps/server/src/testing/pictures';
import type { FuzzReport } from './fuzz-report';
import { send, WEBHOOK_SECRET } from './fuzz-http';
import { fillFields, fillPath, placeholder, preconditions, SETUP_CUSTOMER_EMAIL, SETUP_PEOPLE, setupApi, setupBoard, type Fresh } from './fuzz-fresh';
import { benchValid } from './fuzz-bodies';

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
      // A route's path starts with '/': `req.get('stripe-signature')` or `res.get('etag')` are header reads, not routes.
      const defs = [...text.matchAll(/\b\w+\.(get|post|put|patch|delete)\(\s*'(\/[^']*)'/g)];
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

/** Rows the fuzzer puts in place so routes reached by a secret (a mailed link, a reset token) have a valid space. */
interface Fixtures {
  /** A customer link's token for a job with a sent quote, and that job's quote and invoice. */
  linkToken: string;
  linkQuoteId: string;
  linkInvoiceId: string;
  /** A person of the demo shop that role changes, deactivation and a password reset may hit without ending the run's own sessions. */
  targetUserId: string;
}

const sha256 = (t: string) => createHash('sha256').update(t, 'utf8').digest('hex');

async function makeFixtures(client: pg.Client): Promise<{ fixtures: Fixtures }> {
  await client.query(`INSERT INTO users (id, shop_id, email, name, role, password_hash)
    SELECT 'user-fuzz-target', shop_id, 'fuzz-target@demo.test', 'Fuzz Target', 'tech', password_hash FROM users WHERE email = 'tech@demo.test'`);
  for (const [role, email] of Object.entries(SETUP_PEOPLE)) {
    await client.query(
      `INSERT INTO users (id, shop_id, email, name, role, password_hash) SELECT $1, shop_id, $2, $3, $4, password_hash FROM users WHERE email = 'tech@demo.test'`,
      [`user-fuzz-setup-${role}`, email, `Fuzz set-up ${role}`, role],
    );
  }
  const q = (
    await client.query<{ id: string; job_id: string }>("SELECT id, job_id FROM quotes WHERE shop_id = 'shop-demo' ORDER BY (status = 'sent') DESC, id LIMIT 1")
  ).rows[0];
  const jobId = q?.job_id ?? (await client.query<{ id: string }>("SELECT id FROM jobs WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1")).rows[0]!.id;
  const inv = (await client.query<{ id: string }>('SELECT id FROM invoices WHERE job_id = $1 LIMIT 1', [jobId])).rows[0];
  const linkToken = randomBytes(32).toString('base64url'); // the shape of a mailed link's token
  await client.query("INSERT INTO customer_links (id, shop_id, job_id, token_hash, expires_at) VALUES ($1, 'shop-demo', $2, $3, now() + interval '1 day')", [
    randomUUID(),
    jobId,
    sha256(linkToken),
  ]);
  return { fixtures: { linkToken, linkQuoteId: q?.id ?? 'no-such-id', linkInvoiceId: inv?.id ?? 'no-such-id', targetUserId: 'user-fuzz-target' } };
}

// The row a `:param` names, by the segment before it; rows of the demo shop, so its people reach them.
const ID_QUERIES: Record<string, string> = {
  jobs: "SELECT id FROM jobs WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  customers: "SELECT id FROM customers WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  boards: "SELECT id FROM board_models WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  versions: "SELECT v.id FROM board_model_versions v JOIN board_models b ON b.id = v.board_id WHERE b.shop_id = 'shop-demo' ORDER BY v.id LIMIT 1",
  quotes: "SELECT id FROM quotes WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  invoices: "SELECT id FROM invoices WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  readings: "SELECT id FROM readings WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  invitations: "SELECT id FROM invitations WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  uploads: "SELECT id FROM uploads WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
  'parts-bin': "SELECT id FROM bin_parts WHERE shop_id = 'shop-demo' ORDER BY id LIMIT 1",
};

const VERIFIED_JOB = "SELECT id FROM jobs WHERE shop_id = 'shop-demo' AND status IN ('verified', 'returned') ORDER BY id LIMIT 1";

async function fillParams(path: string, client: pg.Client, f: Fixtures): Promise<string> {
  const parts = path.split('/');
  const isPublic = path.startsWith('/api/public/links/');
  for (let i = 0; i < parts.length; i++) {
    if (!parts[i]!.startsWith(':')) continue;
    const before = parts[i - 1] ?? '';
    let id = 'no-such-id';
    if (before === 'links') id = f.linkToken;
    else if (isPublic && before === 'quotes') id = f.linkQuoteId;
    else if (isPublic && before === 'invoices') id = f.linkInvoiceId;
    // a trainee's guided order is set on a trainee; role changes and deactivation hit the fuzzer's own target
    else if (before === 'users') id = parts[i + 1] === 'guided-order' ? 'user-trainee' : f.targetUserId;
    // an invoice is issued on a verified job: that route gets one, so its valid space is reachable
    else if (before === 'jobs' && parts[i + 1] === 'invoices') id = (await client.query<{ id: string }>(VERIFIED_JOB)).rows[0]?.id ?? id;
    else if (ID_QUERIES[before]) id = (await client.query<{ id: string }>(ID_QUERIES[before]!).catch(() => null))?.rows[0]?.id ?? id;
    parts[i] = encodeURIComponent(id);
  }
  return parts.join('/');
}

// What a refused or read-only request may still write, by design: a failed sign-in is audited, a session is
// extended when used, billing settings are created with their defaults on first read, a customer link notes its use.
const REFUSED_MAY_WRITE: Record<string, string[]> = {
  'POST /api/auth/sign-in': ['audit_log'],
  'POST /api/public/links/:token/quotes/:id/approve': ['customer_links'],
  'POST /api/public/links/:token/quotes/:id/decline': ['customer_links'],
  'POST /api/public/links/:token/invoices/:id/checkout': ['customer_links'],
};
const READS_MAY_WRITE = ['sessions', 'billing_settings', 'service_terms', 'customer_links'];
// Written by the server's own background work, whatever request is in flight: a board model's fault dictionary is
// built in the background after the server starts or a board changes (diagnosis/dictionary.ts), and the fault pairs
// a diagnosis calls for are computed in the worker and stored after the read that asked for them has answered.
const BACKGROUND_TABLES = ['fault_dictionaries', 'fault_dictionary_rows', 'fault_dictionary_pairs'];
// Routes that answer before their work is done, on purpose: a reset request answers at once whether or not the
// address has an account (its timing tells nothing), then writes the link and mails it.
const ANSWERS_FIRST = ['POST /api/auth/password-reset'];

async function loadRealIds(client: pg.Client): Promise<void> {
  const ids = async (q: string) => (await client.query<{ id: string }>(q)).rows.map((r) => r.id);
  realIds.customerId = await ids("SELECT id FROM customers WHERE shop_id = 'shop-demo'");
  realIds.boardId = await ids("SELECT id FROM board_models WHERE shop_id = 'shop-demo'");
  realIds.assigneeId = await ids("SELECT id FROM users WHERE shop_id = 'shop-demo'");
  realIds.jobId = await ids("SELECT id FROM jobs WHERE shop_id = 'shop-demo'");
  realIds.quoteId = await ids("SELECT id FROM quotes WHERE shop_id = 'shop-demo'");
  realIds.supersedes = await ids("SELECT id FROM readings WHERE shop_id = 'shop-demo' LIMIT 20");
  realIds.duplicateId = await ids("SELECT id FROM customers WHERE shop_id = 'shop-demo' ORDER BY id OFFSET 1");
  realIds.invoiceId = await ids("SELECT id FROM invoices WHERE shop_id = 'shop-demo'");
  // test point labels of the demo boards for the probes (red/black), beside the net names
  realIds.red = ['TP1', 'TP2', 'TP3', 'TP4', 'TP5', 'TP6', 'gnd', '0'];
  realIds.black = ['0', 'gnd', 'TP1'];
}

interface BoardDocs {
  /** New board models (the first demo board's document under new ids): a create has a valid space. */
  fresh: unknown[];
  /** The stored document of the board the PATCH route's path names: a new version of it. */
  current: unknown[];
}

async function boardDocs(client: pg.Client): Promise<BoardDocs> {
  const { rows } = await client.query<{ id: string; document: Record<string, unknown> }>(
    "SELECT b.id, v.document FROM board_models b JOIN board_model_versions v ON v.board_id = b.id AND v.version = b.current_version WHERE b.shop_id = 'shop-demo' ORDER BY b.id LIMIT 1",
  );
  const doc = rows[0]?.document;
  if (!doc) return { fresh: [], current: [] };
  const fresh = Array.from({ length: 40 }, (_, i) => ({ ...doc, id: `fuzz-board-${i}`, slug: `fuzz-board-${i}`, name: `Fuzz board ${i}` }));
  return { fresh, current: [doc] };
}

/** A payment-service event as the webhook receives it, about the demo shop's invoices (signed by `send`). */
const paymentEventArb = () =>
  fc.record({
    id: fc.string({ minLength: 1, maxLength: 30 }).map((s) => `evt_${s.replace(/[^A-Za-z0-9]/g, 'x')}`),
    object: fc.constant('event'),
    type: fc.constantFrom('checkout.session.completed', 'checkout.session.expired', 'payment_intent.succeeded', 'charge.refunded'),
    created: fc.integer({ min: 1_700_000_000, max: 1_900_000_000 }),
    data: fc.record({
      object: fc.record({
        id: fc.string({ minLength: 1, maxLength: 30 }).map((s) => `cs_${s.replace(/[^A-Za-z0-9]/g, 'x')}`),
        object: fc.constant('checkout.session'),
        payment_status: fc.constantFrom('paid', 'unpaid'),
        amount_total: fc.integer({ min: 0, max: 1_000_000 }),
        metadata: fc.record({ invoiceId: realIds.invoiceId?.length ? fc.constantFrom(...realIds.invoiceId) : fc.uuid() }),
      }),
    }),
  });

const PEOPLE = ['admin@demo.test', 'lead@demo.test', 'tech@demo.test', 'trainee@demo.test', 'tech@other.test', null];
const DEMO_PASSWORD = 'splitscope-demo';

/** Field values that open a route's valid space beyond the shared ids: real accounts, tokens the fuzzer holds. */
function routeIds(name: string, boards: BoardDocs): Record<string, unknown[]> {
  if (name === 'POST /api/boards') return { ...realIds, document: boards.fresh };
  if (name === 'PATCH /api/boards/:id') return { ...realIds, document: boards.current };
  if (name === 'GET /api/boards/:id') return { ...realIds, version: [1, 2] };
  if (name === 'POST /api/auth/sign-in') return { ...realIds, email: PEOPLE.filter((e): e is string => !!e), password: [DEMO_PASSWORD] };
  if (name === 'POST /api/auth/password-reset') return { ...realIds, email: PEOPLE.filter((e): e is string => !!e) };
  if (name === 'POST /api/me/password') return { ...realIds, currentPassword: [DEMO_PASSWORD] };
  return realIds;
}

export async function runFuzz({ total, seed, only, log }: { total: number; seed?: number; only?: RegExp; log: (l: string) => void }): Promise<FuzzReport> {
  const t0 = Date.now();
  // `only`: the routes (`METHOD /path`) a shorter run fuzzes; the payloads per route stay as for all of them
  const all = findWriteRoutes();
  const routes = only ? all.filter((r) => only.test(`${r.method} ${r.path}`)) : all;
  const db = await proofDatabase(clusterSpec('test'), 'splitscope_fuzz');
  // The local mail capture and payment fakes, so routes that mail or start a checkout reach their valid space
  // (without a mail relay they answer 503, as a shop's server does while its relay is down).
  const mailDir = mkdtempSync(join(tmpdir(), 'splitscope-fuzz-mail-'));
  const server = await ServerChild.create(db.url, 'fuzz-server.log', {
    LOGIN_RATE_LIMIT: '1000000',
    PAYMENTS_WEBHOOK_SECRET: WEBHOOK_SECRET,
    LOCAL_FAKES: '1',
    PAYMENTS_SECRET_KEY: 'sk_test_local_fake',
    SMTP_PORT: String(await findFreePort(2700 + (process.pid % 200))),
    PAYMENTS_PORT: String(await findFreePort(12400 + (process.pid % 200))),
    MAIL_CAPTURE_DIR: mailDir,
  });
  const client = new pg.Client({ connectionString: db.url });
  const report: FuzzReport = {
    ok: false,
    tried: 0,
    routes: routes.length,
    accepted: 0,
    refused: 0,
    serverErrors: [],
    changes: [],
    stateErrors: [],
    setupErrors: [],
    perRoute: {},
    unmapped: [],
    statuses: {},
    seconds: 0,
  };
  try {
    await server.start();
    await client.connect();
    const { fixtures } = await makeFixtures(client);
    // every role of the demo shop, a technician of the other shop, and nobody
    const passwords = PEOPLE.map(() => DEMO_PASSWORD);
    const sessions: (Session | null)[] = await Promise.all(PEOPLE.map((e) => (e ? signIn(server.url, e) : null)));
    // A fuzzed "sign out everywhere" or password change ends a session the run still uses: sign in again.
    const renew = async (k: number) => {
      const email = PEOPLE[k];
      if (email) sessions[k] = await signIn(server.url, email, passwords[k]).catch(() => null);
    };
    await loadRealIds(client);
    const boards = await boardDocs(client);
    await installWriteLog(client);
    const perRoute = Math.max(only ? 1 : 50, Math.ceil(total / Math.max(1, all.length)));
    const schemas = contract as unknown as Record<string, ZodSchema | undefined>;
    const setup = setupApi(server.url, client);
    const PRE = preconditions(server.url);
    const board = await setupBoard(setup);
    for (const route of routes) {
      const name = `${route.method} ${route.path}`;
      const stats = (report.perRoute[name] = { accepted: 0, refused: 0 });
      const schema = route.schemaName ? schemas[route.schemaName] : undefined;
      if (!schema && route.method !== 'GET') report.unmapped.push(`${name} (${route.file})`);
      const pre = PRE[name];
      const ids = { ...routeIds(name, boards), ...Object.fromEntries((pre?.fields ?? []).map((f) => [f, [placeholder(f)]])) };
      const bodySchema = schema ?? ((route.method === 'GET' ? contract.idParams : contract.createReadingRequest) as unknown as ZodSchema);
      const arb = route.path.includes('/webhooks/')
        ? payloadArbOf(paymentEventArb(), ['id', 'type', 'created', 'data'])
        : payloadArb(bodySchema, ids, benchValid(name, bodySchema, ids, board, SETUP_CUSTOMER_EMAIL) ?? undefined);
      const samples = fc.sample(arb, { numRuns: perRoute, seed: seed === undefined ? undefined : seed + report.tried });
      const paths = [await fillParams(route.path, client, fixtures), route.path.replace(/:\w+/g, 'no-such-id')];
      // A fresh row for the route (a token, a sent quote, a picture): made before the first payload and again once
      // an accepted payload used it up.
      let fresh: Fresh | null = null;
      let usedUp = true;
      let setupFailed = false;
      // Who the route lets in, learnt from its answers: after a first round over everyone, three payloads in four
      // go as the people it accepted, so the valid space is reached; every fourth still goes round everyone.
      const letIn: number[] = [];
      let errors = 0;
      await takeWrites(client);
      for (const [i, p] of samples.entries()) {
        const k = i < 2 * PEOPLE.length || i % 4 === 0 || letIn.length === 0 ? i % PEOPLE.length : letIn[i % letIn.length]!;
        // Signing out would end the session the rest of the run uses: that route gets none.
        const session = route.path.endsWith('/auth/sign-out') ? null : sessions[k]!;
        if (pre && !setupFailed && (fresh === null || (pre.once && usedUp))) {
          fresh = await pre.make(setup).catch((err: Error) => {
            report.setupErrors.push(`${name}: ${err.message}`);
            log(`fuzz: FAIL set-up ${name}: ${err.message}`);
            setupFailed = true;
            return null;
          });
          if (fresh) paths[0] = await fillParams(fillPath(route.path, fresh), client, fixtures);
          usedUp = false;
          await takeWrites(client); // the set-up's own writes are not the next request's
        }
        const url = server.url + paths[i % 7 === 6 ? 1 : 0];
        // a change of one's own password needs the current one, which an earlier accepted change may have changed
        const text = fillFields(
          name === 'POST /api/me/password'
            ? p.text.replace(`"currentPassword":"${DEMO_PASSWORD}"`, `"currentPassword":${JSON.stringify(passwords[k])}`)
            : p.text,
          fresh,
        );
        // An upload's body is a picture: three in four payloads are a whole small PNG or JPEG, some for a job.
        const picture = name === 'POST /api/uploads' && i % 4 !== 3 ? await smallPicture((i * 0.618) % 1) : null;
        const answer = picture
          ? await send(
              'POST',
              `${url}?${new URLSearchParams({ name: `board-${i}.${picture.type === 'image/png' ? 'png' : 'jpg'}`, ...(i % 2 && realIds.jobId?.length ? { jobId: String(realIds.jobId[i % realIds.jobId.length]) } : {}) })}`,
              { text: '', bytes: picture.bytes, contentType: picture.type, label: 'picture' },
              session,
              false,
            )
          : await send(route.method, url, { ...p, text }, session, route.path.includes('/webhooks/'));
        const status = answer.status;
        report.tried++;
        report.statuses[status] = (report.statuses[status] ?? 0) + 1;
        if (status >= 500 || status === 0) {
          errors++;
          if (report.serverErrors.length < 20) report.serverErrors.push({ route: name, status, label: p.label, sample: text.slice(0, 300) });
        }
        const writes = ANSWERS_FIRST.includes(name) ? await settledWrites(client) : await takeWrites(client);
        const changed = writes.changed.filter((t) => !BACKGROUND_TABLES.includes(t));
        const inserted = writes.inserted.filter((t) => !BACKGROUND_TABLES.includes(t));
        if (status >= 200 && status < 400) {
          report.accepted++;
          stats.accepted++;
          usedUp = true;
          if (fresh && pre?.accepted) pre.accepted(fresh, answer.body);
          if (session && !letIn.includes(k)) letIn.push(k);
          if (name === 'POST /api/me/password') passwords[k] = (JSON.parse(text) as { newPassword: string }).newPassword;
          // State assertions: a read writes nothing of substance, and a 201 stored a row somewhere.
          const stray = route.method === 'GET' ? changed.filter((t) => !READS_MAY_WRITE.includes(t)) : [];
          if (stray.length && report.stateErrors.length < 20)
            report.stateErrors.push({ route: name, status, label: p.label, problem: `a read changed ${stray.join(', ')}` });
          if (status === 201 && inserted.length === 0 && report.stateErrors.length < 20)
            report.stateErrors.push({ route: name, status, label: p.label, problem: '201 Created but no table has a new row' });
        } else {
          report.refused++;
          stats.refused++;
          const allowed = REFUSED_MAY_WRITE[name] ?? [];
          // using a session moves its idle expiry on, whatever the answer (auth/lucia.ts): not the refused request's doing
          const tables = changed.filter((t) => !allowed.includes(t) && t !== 'sessions' && !(route.method === 'GET' && READS_MAY_WRITE.includes(t)));
          if (tables.length && report.changes.length < 20) report.changes.push({ route: name, status, label: p.label, tables });
        }
        // Signing in again writes a session: after this request's footprint is taken, and out of the next one's.
        if (status === 401 && session) {
          await renew(k);
          await takeWrites(client);
        }
      }
      log(
        `fuzz: ${name}: ${stats.accepted} accepted, ${stats.refused} refused of ${samples.length}, ${errors} answered 5xx${schema ? ` from ${route.schemaName}` : ' (no contract schema found)'}`,
      );
    }
    const h = await fetch(`${server.url}/api/health`).catch(() => null);
    if (!h || h.status !== 200) report.serverErrors.push({ route: 'GET /api/health after fuzzing', status: h?.status ?? 0, label: 'health', sample: '' });
  } finally {
    await client.end().catch(() => undefined);
    await server.kill('SIGTERM');
    await db.drop();
    rmSync(mailDir, { recursive: true, force: true });
  }
  report.seconds = (Date.now() - t0) / 1000;
  report.ok =
    report.tried > 0 && report.setupErrors.length === 0 && report.serverErrors.length === 0 && report.changes.length === 0 && report.stateErrors.length === 0;
  return report;
}
