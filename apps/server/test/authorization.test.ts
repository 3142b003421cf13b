// The authorization matrix: every API route × every role × own shop / other shop, from one table. A route
// registered on the app but missing here fails the test, so a new route cannot skip its access rules.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@splitscope/contract';
import { eq } from 'drizzle-orm';
import { createApp } from '../src/app';
import { boardModelVersions, invitations, jobs } from '../src/db/schema';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob, DIVIDER_BOARD } from '../src/testing/factories';
import { Client, listenApp, startTestServer } from './harness';
import { apiRoutes } from './routes';
import { TINY_PNG } from './pictures';

const ALL: Role[] = ['admin', 'lead', 'tech', 'trainee'];
const BENCH: Role[] = ['admin', 'lead', 'tech'];
const REVIEWERS: Role[] = ['admin', 'lead'];
const ADMIN: Role[] = ['admin'];

/** `kind` names which row an `:id` stands for; `public` routes answer without a session. */
type Kind = 'job' | 'customer' | 'board' | 'drawnVersion' | 'user' | 'upload' | 'quote' | 'invoice' | 'invitation';
interface Entry {
  method: string;
  path: string;
  roles?: Role[];
  kind?: Kind;
  public?: boolean;
  /** Routes of the billing feature and the customer portal (the portal's token rules are in billing.test.ts). */
  billing?: boolean;
  /** A body that passes validation, so the shop scoping (404) is reached; default {}. */
  body?: () => unknown;
  /** The call ends the caller's sessions: the role's client signs in again after it. */
  endsSession?: boolean;
  /**
   * A test-only route (testing/routes.ts): served on a demo server with the local fakes (test-shops.test.ts) and
   * absent, 404, in shop mode and without the fakes.
   */
  testOnly?: boolean;
  /** Own-shop answers that differ from "allowed": a trainee records readings only on jobs assigned to them. */
  own?: Partial<Record<Role, number>>;
}

const quoteBody = () => ({ lines: [{ kind: 'labour', description: 'Matrix bench time', quantity: '1', unitCents: 5000 }] });
const meterImportBody = () => ({ importKey: `matrix-${crypto.randomUUID()}`, profileId: 'matrix-no-such-profile', csv: 'point,value\nTP1,310\n' });
const readingBody = () => ({ idempotencyKey: crypto.randomUUID(), mode: 'dcv', red: 'TP2', black: '0', power: 'on', value: 7.5, raw: '7.5' });

const TABLE: Entry[] = [
  { method: 'GET', path: '/api/health', public: true },
  { method: 'POST', path: '/api/auth/sign-in', public: true },
  { method: 'POST', path: '/api/auth/sign-out', public: true },
  { method: 'GET', path: '/api/auth/session', public: true },
  { method: 'POST', path: '/api/auth/accept-invitation', public: true },
  { method: 'GET', path: '/api/setup', public: true },
  { method: 'POST', path: '/api/setup', public: true },
  { method: 'POST', path: '/api/auth/password-reset', public: true },
  { method: 'POST', path: '/api/auth/password-reset/confirm', public: true },
  { method: 'GET', path: '/api/me', roles: ALL },
  { method: 'POST', path: '/api/me/password', roles: ALL },
  { method: 'POST', path: '/api/auth/sign-out-everywhere', roles: ALL, endsSession: true },
  { method: 'GET', path: '/api/shop', roles: ALL },
  { method: 'PATCH', path: '/api/shop', roles: ADMIN, body: () => ({ sessionIdleHours: 12 }) },
  { method: 'GET', path: '/api/users', roles: ALL },
  { method: 'GET', path: '/api/users/invitations', roles: ADMIN },
  { method: 'POST', path: '/api/users/invitations', roles: ADMIN },
  { method: 'PATCH', path: '/api/users/:id', roles: ADMIN, kind: 'user', body: () => ({ role: 'trainee' }) },
  // Without a mail server here the admin's resend answers 503: past the guard and the shop check.
  { method: 'POST', path: '/api/users/invitations/:id/resend', roles: ADMIN, kind: 'invitation' },
  { method: 'GET', path: '/api/customers', roles: ALL },
  { method: 'POST', path: '/api/customers', roles: BENCH },
  { method: 'GET', path: '/api/customers/:id', roles: ALL, kind: 'customer' },
  { method: 'PATCH', path: '/api/customers/:id', roles: REVIEWERS, kind: 'customer', body: () => ({ notes: 'matrix' }) },
  // Merging a customer into itself: 422 in the own shop (after the shop check), 404 for another shop's customer.
  { method: 'POST', path: '/api/customers/:id/merge', roles: REVIEWERS, kind: 'customer', body: () => ({ duplicateId: ids.own.customer }) },
  { method: 'GET', path: '/api/boards', roles: ALL },
  { method: 'POST', path: '/api/boards', roles: ADMIN },
  { method: 'GET', path: '/api/boards/:id', roles: ALL, kind: 'board' },
  { method: 'PATCH', path: '/api/boards/:id', roles: REVIEWERS, kind: 'board', body: () => ({ document: DIVIDER_BOARD }) },
  { method: 'GET', path: '/api/boards/versions/:id/picture', roles: ALL, kind: 'drawnVersion' },
  { method: 'GET', path: '/api/boards/:id/versions', roles: ALL, kind: 'board' },
  { method: 'PUT', path: '/api/boards/versions/:id/document', roles: REVIEWERS, kind: 'drawnVersion', body: () => ({ document: DIVIDER_BOARD }) },
  { method: 'GET', path: '/api/fault-codes', roles: ALL },
  { method: 'POST', path: '/api/fault-codes', roles: REVIEWERS },
  // No fault code or drawer has the id `:id`: a role past the guard gets its 404.
  { method: 'PUT', path: '/api/fault-codes/:id', roles: REVIEWERS },
  { method: 'DELETE', path: '/api/fault-codes/:id', roles: REVIEWERS, own: { admin: 404, lead: 404 } },
  { method: 'PUT', path: '/api/users/:id/guided-order', roles: REVIEWERS, kind: 'user', body: () => ({ lifted: false }) },
  { method: 'POST', path: '/api/boards/unlisted', roles: BENCH },
  { method: 'GET', path: '/api/boards/:id/draft', roles: ALL, kind: 'board' },
  {
    method: 'PUT',
    path: '/api/boards/:id/draft',
    roles: BENCH,
    kind: 'board',
    body: () => ({ capture: { photo: { uploadId: ids.own.upload, width: 1, height: 1 } } }),
  },
  { method: 'POST', path: '/api/boards/:id/publish', roles: REVIEWERS, kind: 'board' },
  { method: 'GET', path: '/api/boards/:id/references', roles: ALL, kind: 'board' },
  {
    method: 'POST',
    path: '/api/boards/:id/references',
    roles: BENCH,
    kind: 'board',
    body: () => ({ readings: [{ mode: 'dcv', red: 'TP1', black: '0', power: 'on', value: 310 }] }),
  },
  { method: 'POST', path: '/api/jobs/:id/reference', roles: REVIEWERS, kind: 'job' },
  { method: 'GET', path: '/api/jobs/:id/upload-refusals', roles: ALL, kind: 'job' },
  { method: 'GET', path: '/api/service-terms', roles: ALL },
  { method: 'PATCH', path: '/api/service-terms', roles: ADMIN },
  { method: 'GET', path: '/api/board-history', roles: ALL },
  { method: 'GET', path: '/api/jobs/:id/history', roles: ALL, kind: 'job' },
  { method: 'GET', path: '/api/parts-bin', roles: ALL },
  { method: 'GET', path: '/api/parts-bin/reorder', roles: ALL },
  { method: 'POST', path: '/api/parts-bin', roles: BENCH },
  { method: 'PATCH', path: '/api/parts-bin/:id', roles: BENCH, own: { admin: 404, lead: 404, tech: 404 } },
  { method: 'GET', path: '/api/jobs/:id/quote-draft', roles: BENCH, kind: 'job' },
  { method: 'GET', path: '/api/meter-profiles', roles: ALL },
  { method: 'PUT', path: '/api/meter-profiles', roles: BENCH },
  { method: 'POST', path: '/api/jobs/:id/meter-import/preview', roles: BENCH, kind: 'job', body: meterImportBody },
  { method: 'POST', path: '/api/jobs/:id/meter-import', roles: BENCH, kind: 'job', body: meterImportBody },
  { method: 'GET', path: '/api/stats', roles: REVIEWERS },
  { method: 'GET', path: '/api/jobs/:id/bench-meter', roles: ALL, kind: 'job' },
  { method: 'POST', path: '/api/jobs/:id/bench-meter', roles: ALL, kind: 'job', body: () => ({ mode: 'dcv', red: 'TP2', black: '0', power: 'on' }) },
  { method: 'DELETE', path: '/api/jobs/:id/bench-meter', roles: ALL, kind: 'job' },
  { method: 'GET', path: '/api/bench-meter/next', roles: ALL },
  // A bridge sends answers only for requests of its own person: no request has the id `:armId`.
  {
    method: 'POST',
    path: '/api/bench-meter/requests/:armId/reading',
    roles: ALL,
    body: () => ({ answer: '+1.5E+01' }),
    own: { admin: 404, lead: 404, tech: 404, trainee: 404 },
  },
  { method: 'GET', path: '/api/jobs', roles: ALL },
  { method: 'POST', path: '/api/jobs', roles: BENCH },
  { method: 'GET', path: '/api/jobs/:id', roles: ALL, kind: 'job' },
  { method: 'PATCH', path: '/api/jobs/:id', roles: BENCH, kind: 'job', body: () => ({ priority: 'normal' }) },
  { method: 'GET', path: '/api/jobs/:id/readings', roles: ALL, kind: 'job' },
  { method: 'POST', path: '/api/jobs/:id/readings', roles: ALL, kind: 'job', body: readingBody, own: { trainee: 403 } },
  // No reading has the id `:readingId`: a role past the guard gets the 404 of the reading, a trainee the 403 of a job not theirs.
  {
    method: 'POST',
    path: '/api/jobs/:id/readings/:readingId/strike',
    roles: ALL,
    kind: 'job',
    body: () => ({ reason: 'matrix strike' }),
    own: { admin: 404, lead: 404, tech: 404, trainee: 403 },
  },
  { method: 'GET', path: '/api/jobs/:id/diagnosis', roles: ALL, kind: 'job' },
  { method: 'GET', path: '/api/jobs/:id/diagnosis-snapshots', roles: ALL, kind: 'job' },
  { method: 'GET', path: '/api/jobs/:id/reviews', roles: ALL, kind: 'job' },
  { method: 'POST', path: '/api/jobs/:id/reviews', roles: REVIEWERS, kind: 'job', body: () => ({ decision: 'approve' }) },
  { method: 'GET', path: '/api/jobs/:id/repairs', roles: ALL, kind: 'job' },
  { method: 'POST', path: '/api/jobs/:id/repairs', roles: BENCH, kind: 'job', body: () => ({ part: 'R1', action: 'cleaned' }) },
  { method: 'GET', path: '/api/jobs/:id/report', roles: ALL, kind: 'job' },
  { method: 'POST', path: '/api/uploads', roles: ALL },
  { method: 'GET', path: '/api/uploads/:id', roles: ALL, kind: 'upload' },
  { method: 'GET', path: '/api/jobs/:id/uploads', roles: ALL, kind: 'job' },
  // Billing and the customer portal.
  { method: 'POST', path: '/api/', public: true, billing: true },
  { method: 'GET', path: '/api/public/links/:token', public: true, billing: true },
  { method: 'POST', path: '/api/public/links/:token/quotes/:id/approve', public: true, billing: true },
  { method: 'POST', path: '/api/public/links/:token/quotes/:id/decline', public: true, billing: true },
  { method: 'GET', path: '/api/public/links/:token/report.pdf', public: true, billing: true },
  { method: 'GET', path: '/api/public/links/:token/logo', public: true, billing: true },
  { method: 'POST', path: '/api/public/links/:token/invoices/:id/checkout', public: true, billing: true },
  // Everyone reads billing; admin, lead and tech quote, invoice and mail the customer; only the admin
  // changes the shop's billing settings or reads the development outbox.
  { method: 'GET', path: '/api/billing/settings', roles: ALL, billing: true },
  { method: 'PATCH', path: '/api/billing/settings', roles: ADMIN, billing: true },
  { method: 'GET', path: '/api/shop/duties', roles: ALL },
  { method: 'PATCH', path: '/api/shop/duties', roles: ADMIN, body: () => ({ selfApproval: false }) },
  { method: 'GET', path: '/api/jobs/:jobId/billing', roles: ALL, kind: 'job', billing: true },
  { method: 'POST', path: '/api/jobs/:jobId/notify', roles: BENCH, kind: 'job', billing: true },
  { method: 'POST', path: '/api/jobs/:jobId/quotes', roles: BENCH, kind: 'job', billing: true, body: quoteBody },
  { method: 'GET', path: '/api/quotes/:id', roles: ALL, kind: 'quote', billing: true },
  { method: 'PATCH', path: '/api/quotes/:id', roles: BENCH, kind: 'quote', billing: true, body: () => ({ note: 'matrix' }) },
  { method: 'POST', path: '/api/quotes/:id/send', roles: BENCH, kind: 'quote', billing: true },
  { method: 'POST', path: '/api/jobs/:jobId/invoices', roles: BENCH, kind: 'job', billing: true, body: () => ({ ...quoteBody(), send: false }) },
  { method: 'GET', path: '/api/invoices/:id', roles: ALL, kind: 'invoice', billing: true },
  { method: 'POST', path: '/api/invoices/:id/send', roles: BENCH, kind: 'invoice', billing: true },
  { method: 'GET', path: '/api/dev/mail', roles: ADMIN, billing: true },
  { method: 'GET', path: '/api/dev/mail/:id', roles: ADMIN, billing: true },
  // A browser spec's own shop: made and removed without a session, on a demo server with the local fakes only.
  { method: 'POST', path: '/api/testing/shops', testOnly: true },
  { method: 'GET', path: '/api/testing/shops/:id/rows', testOnly: true },
  { method: 'DELETE', path: '/api/testing/shops/:id', testOnly: true },
];

let server: RunningServer;
const clients = {} as Record<Role, Client>;
const ids = { own: {} as Record<Kind, string>, other: {} as Record<Kind, string> };

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  for (const [side, shopId, author] of [
    ['own', 'shop-demo', 'user-tech'],
    ['other', 'shop-other', 'user-other-tech'],
  ] as const) {
    const customer = await createCustomer(db, { shopId, name: 'Matrix Customer' });
    const board = await createBoardModel(db, { shopId, createdBy: author });
    const job = await createJob(db, { shopId, createdBy: author, customerId: customer.id, boardId: board.id });
    const c = await new Client(server.url).signIn(side === 'own' ? 'tech@demo.test' : 'tech@other.test');
    const png = TINY_PNG;
    const up = await fetch(`${server.url}/api/uploads`, { method: 'POST', headers: { cookie: c.cookie, 'content-type': 'image/png' }, body: png });
    const upload = ((await up.json()) as { id: string }).id;
    // A quote, and an invoice on a second job that is past verification (the invoice comes after it).
    const quote = await c.post(`/api/jobs/${job.id}/quotes`, quoteBody());
    const verified = await createJob(db, { shopId, createdBy: author, customerId: customer.id, boardId: board.id });
    await db.update(jobs).set({ status: 'verified' }).where(eq(jobs.id, verified.id));
    const invoice = await c.post(`/api/jobs/${verified.id}/invoices`, { ...quoteBody(), send: false });
    expect([quote.status, invoice.status]).toEqual([201, 201]);
    const [inv] = await db
      .insert(invitations)
      .values({
        id: crypto.randomUUID(),
        shopId,
        email: `matrix-${side}-${crypto.randomUUID()}@matrix.test`,
        name: 'Matrix Invitee',
        role: 'tech',
        tokenHash: crypto.randomUUID(),
        invitedBy: side === 'own' ? 'user-admin' : author,
        expiresAt: new Date(Date.now() + 86_400_000),
      })
      .returning();
    ids[side] = {
      invitation: inv!.id,
      job: job.id,
      customer: customer.id,
      board: board.id,
      // A composed demo board's version: its drawing is served.
      drawnVersion: (
        await db
          .select({ id: boardModelVersions.id })
          .from(boardModelVersions)
          .where(eq(boardModelVersions.boardId, side === 'own' ? 'board-demo-ofd-220' : 'board-other-ofd-220'))
      )[0]!.id,
      upload,
      user: side === 'own' ? 'user-trainee' : 'user-other-tech',
      quote: String(quote.body.id),
      invoice: String(invoice.body.id),
    };
  }
  for (const role of ALL) clients[role] = await new Client(server.url).signIn(`${role}@demo.test`);
});
afterAll(() => server.close());

const fill = (e: Entry, side: 'own' | 'other') =>
  e.path
    .replace(':id', e.kind ? ids[side][e.kind] : 'unknown-id')
    .replace(':jobId', ids[side].job)
    .replace(':token', 'no-such-token');
// Empty bodies: they pass or fail the guard exactly like real ones, and never change anything.
const call = (c: Client, e: Entry, side: 'own' | 'other') => c.request(e.method, fill(e, side), e.method === 'GET' ? undefined : (e.body?.() ?? {}));

describe('authorization matrix', () => {
  it('covers every registered API route', () => {
    const listed = new Set(TABLE.map((e) => `${e.method} ${e.path}`));
    const missing = apiRoutes(createApp(server.ctx))
      .map((r) => `${r.method} ${r.path}`)
      .filter((r) => !listed.has(r));
    expect(missing).toEqual([]);
  });

  for (const e of TABLE) {
    it(`${e.method} ${e.path}`, async () => {
      if (e.testOnly) {
        for (const change of [{ SPLITSCOPE_MODE: 'shop' as const }, { LOCAL_FAKES: '0' as const }]) {
          const other = await listenApp(createApp({ ...server.ctx, config: { ...server.ctx.config, ...change } }));
          const r = await call(new Client(other.url), e, 'own');
          other.close();
          expect(r.status, `absent with ${JSON.stringify(change)}`).toBe(404);
        }
        return;
      }
      const anon = await call(new Client(server.url), e, 'own');
      if (e.public) {
        expect(anon.status, 'answers without a session').not.toBe(401);
        return;
      }
      expect(anon.status).toBe(401);
      if (!e.roles) return;
      for (const role of ALL) {
        const own = await call(clients[role], e, 'own');
        if (e.endsSession) clients[role] = await new Client(server.url).signIn(`${role}@demo.test`);
        const special = e.own?.[role];
        if (special) expect(own.status, `${role} own shop`).toBe(special);
        else if (e.roles.includes(role)) expect([401, 403, 404], `${role} own shop`).not.toContain(own.status);
        else expect(own.status, `${role} own shop`).toBe(403);
        if (e.kind) {
          const other = await call(clients[role], e, 'other');
          expect(other.status, `${role} other shop`).toBe(e.roles.includes(role) ? 404 : 403);
        }
      }
    });
  }
});
