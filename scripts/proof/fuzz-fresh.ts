// Rows a route's valid space needs that the demo seed cannot give once for all: a single-use secret (a reset or
// invitation token), a duplicate to merge, a fault code to delete, a sent quote and its customer link, an invoiced
// job, a stored picture, a board taken in from its photo. The fuzzer makes a fresh one through the API before a
// route's first payload and again after each accepted payload that used one up, so each route is exercised on
// its accepted path. Jobs are taken through their statuses over the API by the shared job driver
// (apps/server/src/testing/job-driver.ts). Where a step has no API (the reset token reaches a person only by
// e-mail) the step is written to the database and named below.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import type pg from 'pg';
import type { JobStatus } from '../../packages/contract/src/index';
import { healthyReading, jobDriver } from '../../apps/server/src/testing/job-driver';
import { smallPicture } from '../../apps/server/src/testing/pictures';
import { DEMO_BOARD_IDS } from '../../apps/server/src/testing/requests';
import { signIn, type Session } from './env';

/** Path parameters (`:id` → value) and body fields whose value the fuzzer sends as made here. */
export interface Fresh {
  params: Record<string, string>;
  fields: Record<string, unknown>;
}

interface Api {
  session(who: Who): Promise<Session>;
  call(who: Who, method: string, path: string, body?: unknown): Promise<Record<string, unknown>>;
  db: pg.Client;
  /** Made on first use: it reads the board once. */
  driver?: ReturnType<typeof jobDriver>;
}
/**
 * The set-up steps' own people (one per role, made by the fuzzer beside the demo's): a fuzzed password change or
 * "sign out everywhere" of a demo person never locks the set-up out.
 */
type Who = 'admin' | 'lead' | 'tech';
export const SETUP_PEOPLE: Record<Who, string> = { admin: 'fuzz-setup-admin@demo.test', lead: 'fuzz-setup-lead@demo.test', tech: 'fuzz-setup-tech@demo.test' };

interface Precondition {
  /** Body fields filled from `fields` (the generator puts a placeholder there, see `placeholder`). */
  fields?: string[];
  /** An accepted payload used it up (a token, a duplicate, a decision): the next payload gets a fresh one. */
  once: boolean;
  /** After an accepted payload: what the next payload uses instead (a correction corrects the newest reading). */
  accepted?(fresh: Fresh, answer: string): void;
  make(api: Api): Promise<Fresh>;
}

const sha256 = (t: string) => createHash('sha256').update(t, 'utf8').digest('hex');
const tag = () => randomBytes(4).toString('hex');

async function upload(url: string, session: Session): Promise<{ uploadId: string; width: number; height: number }> {
  const p = await smallPicture(Math.random());
  const r = await fetch(`${url}/api/uploads?name=fuzz-board.${p.type === 'image/png' ? 'png' : 'jpg'}`, {
    method: 'POST',
    headers: { 'content-type': p.type, cookie: session.cookie },
    body: new Uint8Array(p.bytes),
  });
  if (r.status !== 201) throw new Error(`fuzz set-up: an upload answered ${r.status}: ${await r.text()}`);
  const up = (await r.json()) as { id: string; width: number; height: number };
  return { uploadId: up.id, width: up.width, height: up.height };
}

async function unlistedBoard(api: Api, url: string, session: Session) {
  const photo = await upload(url, session);
  const board = await api.call('tech', 'POST', '/api/boards/unlisted', { maker: 'Fuzzmark', model: `FZ-${tag()}`, photo });
  return String(board.id);
}

/** The shared job driver on the demo outdoor fan board, calling the API as the set-up's own people. */
function driverOf(api: Api): ReturnType<typeof jobDriver> {
  return (api.driver ??= jobDriver((who, method, path, body) => api.call(who, method.toUpperCase(), `/api${path}`, body), DEMO_BOARD_IDS.outdoorFan));
}

/** A job of a demo customer (e-mail on file) on the outdoor fan board, with a quote sent: its link token from the mail. */
async function sentQuote(api: Api) {
  const jobId = await (await driverOf(api)).jobAt('received', { customerId: 'customer-coastline', unitDescription: 'Outdoor unit (fuzz)' });
  const quote = await api.call('tech', 'POST', `/api/jobs/${jobId}/quotes`, {
    lines: [{ kind: 'labour', description: 'Bench diagnosis', quantity: '1', unitCents: 4500 }],
  });
  await api.call('tech', 'POST', `/api/quotes/${String(quote.id)}/send`, {});
  return { jobId, quoteId: String(quote.id), token: await linkOfMail(api, 'Quote') };
}

const seenMail = new Set<string>();

/** The customer link in the newest mail of this kind the shop sent (the outbox of the local mail capture). */
async function linkOfMail(api: Api, subject: 'Quote' | 'Invoice'): Promise<string> {
  for (let tries = 0; tries < 20; tries++) {
    const list = (await api.call('admin', 'GET', '/api/dev/mail')) as unknown as { items: { id: string; subject: string; receivedAt: string }[] };
    const mail = list.items.filter((m) => m.subject.startsWith(subject) && !seenMail.has(m.id)).sort((a, b) => b.receivedAt.localeCompare(a.receivedAt))[0];
    if (mail) {
      seenMail.add(mail.id);
      const m = /\/c\/([A-Za-z0-9_-]{43})\b/.exec(JSON.stringify(await api.call('admin', 'GET', `/api/dev/mail/${mail.id}`)));
      if (!m) throw new Error(`fuzz set-up: no customer link in mail ${mail.id}`);
      return m[1]!;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`fuzz set-up: no new ${subject} mail in the outbox`);
}

/** A sent quote's job, the quote approved by the customer through its link, then taken to verified by the job driver. */
async function verifiedJob(api: Api) {
  const q = await sentQuote(api);
  await api.call('admin', 'POST', `/api/public/links/${q.token}/quotes/${q.quoteId}/approve`);
  await (await driverOf(api)).advance(q.jobId, 'received', 'verified');
  return q;
}

async function invoicedJob(api: Api) {
  const q = await verifiedJob(api);
  const inv = await api.call('admin', 'POST', `/api/jobs/${q.jobId}/invoices`, { quoteId: q.quoteId });
  await api.call('admin', 'POST', `/api/invoices/${String(inv.id)}/send`, {});
  return { ...q, invoiceId: String(inv.id), token: await linkOfMail(api, 'Invoice') };
}

/** A fresh job of a demo customer taken to `status` by the job driver. */
const jobAt = async (api: Api, status: JobStatus) =>
  (await driverOf(api)).jobAt(status, { customerId: 'customer-jun', unitDescription: 'Outdoor unit (fuzz)', symptom: 'Fan starts, then stops' });

/** A job in diagnosis with a reading of the set-up technician's on it: the reading a correction or a strike names. */
async function jobWithReading(api: Api): Promise<Fresh> {
  const driver = await driverOf(api);
  const id = await jobAt(api, 'diagnosing');
  const row = driver.board.expectedReadings.find((r) => r.mode === 'dcv' && r.power === 'on' && r.lifted.length === 0)!;
  const reading = await api.call('tech', 'POST', `/api/jobs/${id}/readings`, healthyReading(row, 'diagnosis'));
  return { params: { id, readingId: String(reading.id) }, fields: { supersedes: String(reading.id) } };
}

/** A job in diagnosis and the set-up's meter profile (a log of two columns, Point and Reading, DC V powered). */
async function meterImport(api: Api): Promise<Fresh> {
  const { board } = await driverOf(api);
  const black = board.expectedReadings.find((r) => r.mode === 'dcv' && r.power === 'on')?.black ?? 'gnd';
  const profile = await api.call('tech', 'PUT', '/api/meter-profiles', {
    name: 'Fuzz bench meter',
    mapping: { point: 'Point', value: 'Reading' },
    defaultMode: 'dcv',
    defaultReference: black,
    power: 'on',
  });
  return { params: { id: await jobAt(api, 'diagnosing') }, fields: { profileId: String(profile.id) } };
}

/** Preconditions by route (`METHOD /path` as the route files spell it). */
export function preconditions(url: string): Record<string, Precondition> {
  const linkRoute = (needs: 'quote' | 'verified' | 'invoice', once: boolean): Precondition => ({
    once,
    make: async (api) => {
      if (needs === 'invoice') {
        const j = await invoicedJob(api);
        return { params: { token: j.token, id: j.invoiceId }, fields: {} };
      }
      const q = needs === 'quote' ? await sentQuote(api) : await verifiedJob(api);
      return { params: { token: q.token, id: q.quoteId }, fields: {} };
    },
  });
  const unlisted = (once: boolean): Precondition => ({
    once,
    make: async (api) => ({ params: { id: await unlistedBoard(api, url, await api.session('tech')) }, fields: {} }),
  });
  const faultCode = (once: boolean): Precondition => ({
    once,
    make: async (api) => ({
      params: { id: String((await api.call('lead', 'POST', '/api/fault-codes', { code: `Z${tag().slice(0, 5)}`, title: 'Fuzz code' })).id) },
      fields: {},
    }),
  });
  const quoteOf = (send: boolean): Precondition => ({
    once: true,
    make: async (api) => (send ? { params: { id: (await sentQuote(api)).quoteId }, fields: {} } : { params: { id: await draftQuote(api) }, fields: {} }),
  });
  const draftQuote = async (api: Api) => {
    const board = (await api.db.query<{ id: string }>("SELECT id FROM board_models WHERE shop_id = 'shop-demo' AND current_version > 0 ORDER BY id LIMIT 1"))
      .rows[0]!;
    const job = await api.call('tech', 'POST', '/api/jobs', {
      customerId: 'customer-coastline',
      unitDescription: 'Outdoor unit (fuzz)',
      boardId: board.id,
      symptom: 'Fan starts, then stops',
    });
    return String(
      (
        await api.call('tech', 'POST', `/api/jobs/${String(job.id)}/quotes`, {
          lines: [{ kind: 'part', description: 'Opto coupler', quantity: '1', unitCents: 350 }],
        })
      ).id,
    );
  };
  return {
    // the reset link's token reaches a person only by e-mail: the fuzzer stores its hash as the reset request does
    'POST /api/auth/password-reset/confirm': {
      fields: ['token'],
      once: true,
      make: async (api) => {
        const token = `fuzz-reset-${randomBytes(16).toString('hex')}`;
        await api.db.query(
          "INSERT INTO password_resets (id, user_id, token_hash, expires_at) VALUES ($1, 'user-fuzz-target', $2, now() + interval '30 minutes')",
          [randomUUID(), sha256(token)],
        );
        return { params: {}, fields: { token } };
      },
    },
    'POST /api/auth/accept-invitation': {
      fields: ['token'],
      once: true,
      make: async (api) => ({
        params: {},
        fields: {
          token: (await api.call('admin', 'POST', '/api/users/invitations', { name: 'Fuzz Invitee', email: `invitee-${tag()}@demo.test`, role: 'tech' })).token,
        },
      }),
    },
    'POST /api/users/invitations/:id/resend': {
      once: false,
      make: async (api) => ({
        params: {
          id: String(
            (await api.call('admin', 'POST', '/api/users/invitations', { name: 'Fuzz Invitee', email: `invitee-${tag()}@demo.test`, role: 'trainee' })).id,
          ),
        },
        fields: {},
      }),
    },
    'POST /api/customers/:id/merge': {
      fields: ['duplicateId'],
      once: true,
      make: async (api) => ({
        params: { id: 'customer-northgate' },
        fields: {
          duplicateId: (await api.call('admin', 'POST', '/api/customers', { name: 'Rafael Osei', company: 'Northgate Heating', kind: 'contractor' })).id,
        },
      }),
    },
    'PUT /api/fault-codes/:id': faultCode(false),
    'DELETE /api/fault-codes/:id': faultCode(true),
    'POST /api/boards/unlisted': {
      fields: ['photo'],
      once: true,
      make: async (api) => ({ params: {}, fields: { photo: await upload(url, await api.session('tech')) } }),
    },
    'GET /api/boards/:id/draft': unlisted(false),
    'PUT /api/boards/:id/draft': unlisted(false),
    'POST /api/boards/:id/publish': unlisted(true),
    'GET /api/uploads/:id': { once: false, make: async (api) => ({ params: { id: (await upload(url, await api.session('tech'))).uploadId }, fields: {} }) },
    'PATCH /api/quotes/:id': quoteOf(false),
    'POST /api/quotes/:id/send': quoteOf(false),
    'GET /api/quotes/:id': quoteOf(true),
    'POST /api/public/links/:token/quotes/:id/approve': linkRoute('quote', true),
    'POST /api/public/links/:token/quotes/:id/decline': linkRoute('quote', true),
    'GET /api/public/links/:token': linkRoute('quote', false),
    'GET /api/public/links/:token/logo': linkRoute('quote', false),
    'GET /api/public/links/:token/report.pdf': linkRoute('verified', false),
    'POST /api/public/links/:token/invoices/:id/checkout': linkRoute('invoice', true),
    'POST /api/jobs/:id/readings': {
      once: false,
      make: jobWithReading,
      accepted: (fresh, answer) => {
        fresh.fields.supersedes = (JSON.parse(answer) as { id: string }).id;
      },
    },
    'POST /api/jobs/:id/readings/:readingId/strike': { once: true, make: jobWithReading },
    'POST /api/jobs/:id/meter-import/preview': { once: false, make: meterImport },
    'POST /api/jobs/:id/meter-import': { once: false, make: meterImport },
    'POST /api/jobs/:id/reviews': { once: true, make: async (api) => ({ params: { id: await jobAt(api, 'awaiting-review') }, fields: {} }) },
    'POST /api/jobs/:id/repairs': { once: false, make: async (api) => ({ params: { id: await jobAt(api, 'approved') }, fields: {} }) },
    'POST /api/jobs/:id/reference': { once: true, make: async (api) => ({ params: { id: await jobAt(api, 'verified') }, fields: {} }) },
    // the board the bench routes' bodies are drawn from (fuzz-bodies.ts)
    'POST /api/boards/:id/references': { once: false, make: async () => ({ params: { id: DEMO_BOARD_IDS.outdoorFan }, fields: {} }) },
    'GET /api/dev/mail/:id': {
      once: false,
      make: async (api) => {
        await sentQuote(api);
        const list = (await api.call('admin', 'GET', '/api/dev/mail')) as unknown as { items: { id: string }[] };
        return { params: { id: list.items[0]?.id ?? 'no-such-id' }, fields: {} };
      },
    },
    'POST /api/jobs/:jobId/invoices': {
      once: true,
      make: async (api) => {
        const q = await verifiedJob(api);
        return { params: { jobId: q.jobId }, fields: { quoteId: q.quoteId } };
      },
    },
    'GET /api/invoices/:id': { once: false, make: async (api) => ({ params: { id: (await invoicedJob(api)).invoiceId }, fields: {} }) },
    'POST /api/invoices/:id/send': { once: false, make: async (api) => ({ params: { id: (await invoicedJob(api)).invoiceId }, fields: {} }) },
  };
}

/** What the generator puts in a body field the precondition fills; replaced in the payload's text before sending. */
/** The address on file of the customer whose jobs the set-up makes: a quote or invoice goes only there (hole 5). */
export const SETUP_CUSTOMER_EMAIL = 'service@coastline.test';

export const placeholder = (field: string) => `@@fresh:${field}@@`;

/** The payload's text with the fresh values in place of their placeholders (valid JSON stays valid JSON). */
export function fillFields(text: string, fresh: Fresh | null): string {
  if (!fresh) return text;
  let out = text;
  for (const [k, v] of Object.entries(fresh.fields))
    out = out
      .split(JSON.stringify(placeholder(k)))
      .join(JSON.stringify(v))
      .split(placeholder(k))
      .join(String(v));
  return out;
}

/** The route's path with the fresh parameters in place (others as the fuzzer fills them). */
export const fillPath = (path: string, fresh: Fresh | null) =>
  fresh ? path.replace(/:(\w+)/g, (m, name: string) => (fresh.params[name] !== undefined ? encodeURIComponent(fresh.params[name]) : m)) : path;

/** Calls the API as a demo person for a set-up step; signs in again when a fuzzed request ended that session. */
export function setupApi(url: string, db: pg.Client): Api {
  const sessions = new Map<Who, Session>();
  const session = async (who: Who) => sessions.get(who) ?? sessions.set(who, await signIn(url, SETUP_PEOPLE[who])).get(who)!;
  const call = async (who: Who, method: string, path: string, body?: unknown, again = true): Promise<Record<string, unknown>> => {
    const s = await session(who);
    const r = await fetch(url + path, {
      method,
      headers: { cookie: s.cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(60_000),
    });
    if (r.status === 401 && again) {
      sessions.delete(who);
      return call(who, method, path, body, false);
    }
    const text = await r.text();
    if (r.status >= 300) throw new Error(`fuzz set-up: ${method} ${path} as ${who} answered ${r.status}: ${text.slice(0, 300)}`);
    return text ? (JSON.parse(text) as Record<string, unknown>) : {};
  };
  return { session, call, db };
}

/** The board the set-ups open their jobs on, as its detail (expected table, parts). */
export const setupBoard = async (api: Api) => (await driverOf(api)).board;
