// The customer flow end to end against PostgreSQL, the real SMTP capture server and the fake payment API,
// all on loopback: quote e-mailed → link → approve → invoice → hosted checkout → signed webhook → paid.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FakePayments } from '../dev/fakes/payments';
import type { SmtpCapture } from '../dev/fakes/smtp-capture';
import type { Db } from '../src/db/client';
import { boardModels, customerLinks, jobs, paymentEvents, payments } from '../src/db/schema';
import { sendDueStatusMail } from '../src/features/billing/milestones';
import { createCustomerLink, hashToken } from '../src/features/billing/links';
import { newId } from '../src/lib/ids';
import type { RunningServer } from '../src/server';
import { linkIn, SHOP, startBillingRig, type BillingRig } from './billing-fixture';
import { Client } from './harness';

let rig: BillingRig;
let server: RunningServer;
let smtp: SmtpCapture;
let pay: FakePayments;
let db: Db;
let admin: Client;
const makeJob: BillingRig['makeJob'] = (opts) => rig.makeJob(opts);
const setStatus: BillingRig['setStatus'] = (id, status) => rig.setStatus(id, status);

const QUOTE_LINES = [
  { kind: 'part', description: 'Opto-coupler, fan drive', quantity: '1', unitCents: 450 },
  { kind: 'part', description: 'Electrolytic capacitor 470 uF 35 V', quantity: '1', unitCents: 3975 },
  { kind: 'labour', description: 'Bench labour (h)', quantity: '1.5', unitCents: 6500, taxable: false },
];

beforeAll(async () => {
  rig = await startBillingRig();
  ({ server, smtp, pay, db, admin } = rig);
});

afterAll(() => rig?.close());

describe('quote → customer page → invoice → payment', () => {
  it('runs the whole flow, pays once on a replayed webhook and refuses a bad signature', async () => {
    const email = `dana.${newId().slice(0, 6)}@contractor.example.test`;
    const job = await makeJob({ customerName: 'Dana Whitcombe', email });
    const other = await makeJob({ customerName: 'Ravi Castellano', email: 'ravi@fieldtech.example.test' });
    const otherQuote = await admin.post(`/api/jobs/${other.id}/quotes`, {
      lines: [{ kind: 'part', description: 'Secret other-job part', quantity: '1', unitCents: 999 }],
    });
    expect(otherQuote.status).toBe(201);

    // the shop writes the quote: totals in integer cents, tax once on the taxable lines
    const created = await admin.post(`/api/jobs/${job.id}/quotes`, { lines: QUOTE_LINES, note: 'Parts in stock; two working days.' });
    expect(created.status).toBe(201);
    const quote = created.body as unknown as {
      id: string;
      number: string;
      subtotalCents: number;
      taxCents: number;
      totalCents: number;
      status: string;
      lines: { amountCents: number }[];
    };
    expect(quote.lines.map((l) => l.amountCents)).toEqual([450, 3975, 9750]);
    // 44.25 taxable × 8.25 % = 3.650625 → 3.65 (round half away from zero, once per document)
    expect([quote.subtotalCents, quote.taxCents, quote.totalCents]).toEqual([14175, 365, 14540]);
    expect(quote.status).toBe('draft');

    // sent: the e-mail reaches the SMTP capture server with the link, in text and HTML
    const sent = await admin.post(`/api/quotes/${quote.id}/send`);
    expect(sent.status).toBe(200);
    expect(sent.body).toMatchObject({ to: email });
    const quoteMail = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.includes(quote.number));
    expect(quoteMail.subject).toBe(
      `Quote ${quote.number} for job ${job.number}: ${(await db.select().from(boardModels).innerJoin(jobs, eq(jobs.boardId, boardModels.id)).where(eq(jobs.id, job.id)))[0]!.board_models.name}`,
    );
    expect(quoteMail.text).toContain('USD 145.40');
    expect(quoteMail.text).toContain('Tax (8.25 %)');
    const token = linkIn(quoteMail);
    expect(quoteMail.html).toContain(`/c/${token}`);
    // only the hash is stored
    const [stored] = await db
      .select()
      .from(customerLinks)
      .where(eq(customerLinks.tokenHash, hashToken(token)));
    expect(stored).toMatchObject({ jobId: job.id, shopId: SHOP });
    expect(JSON.stringify(await db.select().from(customerLinks).where(eq(customerLinks.jobId, job.id)))).not.toContain(token);

    // the customer page: no sign-in, this job only
    const customer = new Client(server.url);
    const page = await customer.get(`/api/public/links/${token}`);
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ reference: `Job ${job.number}`, customerName: 'Dana Whitcombe', status: 'received', reportAvailable: false });
    const pageText = JSON.stringify(page.body);
    expect(pageText).not.toContain(other.id);
    expect(pageText).not.toContain('Ravi');
    expect(pageText).not.toContain('Secret other-job part');
    expect(pageText).not.toContain(email); // the page never echoes addresses
    // a quote of another job is not reachable through this link
    const foreign = await customer.post(`/api/public/links/${token}/quotes/${(otherQuote.body as unknown as { id: string }).id}/approve`);
    expect(foreign.status).toBe(404);

    // approve: recorded on the quote, the shop is told, the job moves on from received to diagnosing
    const approved = await customer.post(`/api/public/links/${token}/quotes/${quote.id}/approve`);
    expect(approved.status).toBe(200);
    expect((approved.body as unknown as { quotes: { customerApproval: string; status: string }[] }).quotes[0]).toMatchObject({
      customerApproval: 'approved',
      status: 'approved',
    });
    expect((await db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, job.id)))[0]!.status).toBe('diagnosing');
    await smtp.waitFor((m) => m.subject === `Quote ${quote.number} approved by Dana Whitcombe (job ${job.number})`);
    expect((await customer.post(`/api/public/links/${token}/quotes/${quote.id}/approve`)).status).toBe(409);

    // no invoice before verification
    const early = await admin.post(`/api/jobs/${job.id}/invoices`, {});
    expect(early.status).toBe(409);
    await setStatus(job.id, 'verified');

    // the invoice: the approved quote's lines, e-mailed with the report attached as a PDF
    const issued = await admin.post(`/api/jobs/${job.id}/invoices`, {});
    expect(issued.status).toBe(201);
    const invoice = issued.body as unknown as { id: string; number: string; totalCents: number; status: string; quoteId: string };
    expect(invoice).toMatchObject({ status: 'issued', totalCents: 14540, quoteId: quote.id });
    expect((await admin.post(`/api/jobs/${job.id}/invoices`, {})).status).toBe(409); // one open invoice per job
    const invoiceMail = await smtp.waitFor((m) => m.subject.startsWith(`Invoice ${invoice.number}`));
    expect(invoiceMail.attachments).toHaveLength(1);
    expect(invoiceMail.attachments[0]!.contentType).toBe('application/pdf');
    expect(invoiceMail.attachments[0]!.content.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const payToken = linkIn(invoiceMail);
    const report = await fetch(`${server.url}/api/public/links/${payToken}/report.pdf`);
    expect(report.status).toBe(200);
    expect(report.headers.get('content-type')).toMatch(/application\/pdf/);

    // checkout on the fake payment service, through the SDK
    const checkout = await customer.post(`/api/public/links/${payToken}/invoices/${invoice.id}/checkout`);
    expect(checkout.status).toBe(200);
    const url = (checkout.body as unknown as { url: string }).url;
    expect(url.startsWith(`${pay.url}/checkout/cs_test_`)).toBe(true);
    const checkoutPage = await (await fetch(url)).text();
    expect(checkoutPage).toContain('Pay USD 145.40');
    const session = pay.sessions.get(url.split('/').pop()!)!;
    expect(session).toMatchObject({ amount_total: 14540, currency: 'usd', client_reference_id: invoice.id });

    // the customer presses Pay: the fake sends the signed webhook, then sends the browser back to the page
    const paid = await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toBe(`${server.url}/c/${payToken}?paid=${session.id}`);
    expect(pay.deliveries).toHaveLength(1);
    const delivery = pay.deliveries[0]!;
    expect(delivery.status).toBe(200);
    const after = await admin.get(`/api/invoices/${invoice.id}`);
    expect(after.body).toMatchObject({ status: 'paid', paidCents: 14540 });
    await smtp.waitFor((m) => m.subject === `Payment received for invoice ${invoice.number}`);

    // the same event delivered again (redelivery by the provider, and the identical bytes once more): nothing changes
    const again = await fetch(`${pay.url}/_fake/events/${delivery.eventId}/redeliver`, { method: 'POST' });
    expect(((await again.json()) as { status: number }).status).toBe(200);
    const replay = await fetch(`${server.url}/api/webhooks/payments`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': delivery.signature },
      body: delivery.payload,
    });
    expect(replay.status).toBe(200);
    expect(await replay.json()).toEqual({ received: true, outcome: 'duplicate' });
    expect(await db.select().from(payments).where(eq(payments.invoiceId, invoice.id))).toHaveLength(1);
    expect(await db.select().from(paymentEvents).where(eq(paymentEvents.eventId, delivery.eventId))).toHaveLength(1);
    expect((await admin.get(`/api/invoices/${invoice.id}`)).body).toMatchObject({ status: 'paid', paidCents: 14540 });

    // a bad signature, a changed body under a good signature, and none at all: 400, nothing recorded
    const forged = JSON.stringify({ ...JSON.parse(delivery.payload), id: 'evt_test_forged' });
    for (const [body, sig] of [
      [delivery.payload, delivery.signature.replace(/v1=([0-9a-f])/, (_m, c: string) => `v1=${c === '0' ? '1' : '0'}`)],
      [forged, delivery.signature],
      [forged, 't=1,v1=deadbeef'],
    ] as const) {
      const r = await fetch(`${server.url}/api/webhooks/payments`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'stripe-signature': sig },
        body,
      });
      expect(r.status).toBe(400);
      expect(r.headers.get('content-type')).toMatch(/problem\+json/);
    }
    const unsigned = await fetch(`${server.url}/api/webhooks/payments`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: forged });
    expect(unsigned.status).toBe(400);
    expect(await db.select().from(paymentEvents).where(eq(paymentEvents.eventId, 'evt_test_forged'))).toHaveLength(0);

    // a paid invoice opens no second checkout
    expect((await customer.post(`/api/public/links/${payToken}/invoices/${invoice.id}/checkout`)).status).toBe(409);
  });
});

describe('customer links', () => {
  it('answers an altered, expired, malformed or revoked token with the same "no longer valid"', async () => {
    const job = await makeJob({ customerName: 'Mira Oyelaran', email: 'mira@fieldtech.example.test' });
    const link = await createCustomerLink({ db, config: server.ctx.config, shopId: SHOP, jobId: job.id, validDays: 30, createdBy: null });
    const c = new Client(server.url);
    expect((await c.get(`/api/public/links/${link.token}`)).status).toBe(200);
    const last = link.token.at(-1) === 'A' ? 'B' : 'A';
    const altered = link.token.slice(0, -1) + last;
    const expired = await createCustomerLink({ db, config: server.ctx.config, shopId: SHOP, jobId: job.id, validDays: 30, createdBy: null });
    await db
      .update(customerLinks)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(customerLinks.tokenHash, hashToken(expired.token)));
    const revoked = await createCustomerLink({ db, config: server.ctx.config, shopId: SHOP, jobId: job.id, validDays: 30, createdBy: null });
    await db
      .update(customerLinks)
      .set({ revokedAt: new Date() })
      .where(eq(customerLinks.tokenHash, hashToken(revoked.token)));
    for (const t of [altered, expired.token, revoked.token, 'short', `${link.token}x`]) {
      const r = await c.get(`/api/public/links/${encodeURIComponent(t)}`);
      expect(r.status).toBe(404);
      expect(r.body).toMatchObject({ detail: 'This link is no longer valid. Ask the shop to send a new one.' });
    }
    // nothing behind the link works with a dead token either
    expect((await fetch(`${server.url}/api/public/links/${expired.token}/report.pdf`)).status).toBe(404);
  });

  it('records a decline with its reason and tells the shop', async () => {
    const email = 'sol.brandvold@contractor.example.test';
    const job = await makeJob({ customerName: 'Sol Brandvold', email });
    const q = await admin.post(`/api/jobs/${job.id}/quotes`, { lines: [{ kind: 'labour', description: 'Diagnosis (h)', quantity: '1', unitCents: 6500 }] });
    const quote = q.body as unknown as { id: string; number: string };
    await admin.post(`/api/quotes/${quote.id}/send`);
    const token = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.includes(quote.number)));
    const r = await new Client(server.url).post(`/api/public/links/${token}/quotes/${quote.id}/decline`, {
      reason: 'Replacing the whole outdoor unit instead.',
    });
    expect(r.status).toBe(200);
    expect((r.body as unknown as { quotes: unknown[] }).quotes[0]).toMatchObject({
      status: 'declined',
      customerApproval: 'declined',
      declineReason: 'Replacing the whole outdoor unit instead.',
    });
    // a declined job does not move
    expect((await db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, job.id)))[0]!.status).toBe('received');
    const told = await smtp.waitFor((m) => m.subject === `Quote ${quote.number} declined by Sol Brandvold (job ${job.number})`);
    expect(told.text).toContain('Their reason: Replacing the whole outdoor unit instead.');
    // and a declined quote cannot be invoiced
    await setStatus(job.id, 'verified');
    expect((await admin.post(`/api/jobs/${job.id}/invoices`, { quoteId: quote.id })).status).toBe(409);
  });

  it('lets the customer answer only the newest quote once the shop re-quoted', async () => {
    const email = 'kemal.ostrander@contractor.example.test';
    const job = await makeJob({ customerName: 'Kemal Ostrander', email });
    const line = (unitCents: number) => ({ lines: [{ kind: 'part', description: 'Fan-drive transistor', quantity: '1', unitCents }] });
    const first = (await admin.post(`/api/jobs/${job.id}/quotes`, line(1200))).body as unknown as { id: string; number: string };
    await admin.post(`/api/quotes/${first.id}/send`);
    const second = (await admin.post(`/api/jobs/${job.id}/quotes`, line(1500))).body as unknown as { id: string; number: string };
    await admin.post(`/api/quotes/${second.id}/send`);
    const token = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.includes(second.number)));
    const customer = new Client(server.url);
    const old = await customer.post(`/api/public/links/${token}/quotes/${first.id}/approve`);
    expect(old.status).toBe(409);
    expect(old.body).toMatchObject({ detail: `Quote ${first.number} was replaced by quote ${second.number}` });
    expect((await customer.post(`/api/public/links/${token}/quotes/${second.id}/approve`)).status).toBe(200);
  });
});

describe('status e-mails and the outbox', () => {
  it('mails each switched-on milestone once, only for changes after it was switched on', async () => {
    const email = 'kemal.ostrander@fieldtech.example.test';
    const job = await makeJob({ customerName: 'Kemal Ostrander', email, status: 'repaired' });
    // switched on after the job reached "repaired": that change is history and mails nothing
    await new Promise((r) => setTimeout(r, 20));
    expect((await admin.patch('/api/billing/settings', { notifyOn: ['repaired', 'verified'] })).status).toBe(200);
    expect(await sendDueStatusMail({ db, config: server.ctx.config, shopId: SHOP })).toBe(0);
    await setStatus(job.id, 'verified');
    expect(await sendDueStatusMail({ db, config: server.ctx.config, shopId: SHOP })).toBe(1);
    const m = await smtp.waitFor((x) => x.subject === `Job ${job.number}: Verified`);
    expect(m.text).toContain('passed its verification readings');
    expect(linkIn(m)).toHaveLength(43);
    expect(await sendDueStatusMail({ db, config: server.ctx.config, shopId: SHOP })).toBe(0);
    await admin.patch('/api/billing/settings', { notifyOn: [] });
  });

  it('lists captured messages for the shop admin only', async () => {
    const list = await admin.get('/api/dev/mail');
    expect(list.status).toBe(200);
    const items = (list.body as unknown as { items: { id: string; subject: string; attachments: { contentType: string }[] }[] }).items;
    expect(items.length).toBe(smtp.messages.length);
    const withPdf = items.find((i) => i.attachments.some((a) => a.contentType === 'application/pdf'))!;
    const one = await admin.get(`/api/dev/mail/${withPdf.id}`);
    expect(one.status).toBe(200);
    expect(one.body).toMatchObject({ subject: withPdf.subject });
    expect((one.body as unknown as { html: string }).html).toContain('<a href=');
    const tech = await new Client(server.url).signIn('tech@demo.test');
    expect((await tech.get('/api/dev/mail')).status).toBe(403);
  });

  it("answers another shop's job with 404", async () => {
    const job = await makeJob({ customerName: 'Ines Varga', email: null });
    const other = await new Client(server.url).signIn('tech@other.test');
    expect((await other.get(`/api/jobs/${job.id}/billing`)).status).toBe(404);
    expect((await other.post(`/api/jobs/${job.id}/quotes`, { lines: QUOTE_LINES })).status).toBe(404);
    const mine = await admin.get(`/api/jobs/${job.id}/billing`);
    expect(mine.status).toBe(200);
    // no address on file and none given: refused before anything is sent
    const q = await admin.post(`/api/jobs/${job.id}/quotes`, { lines: QUOTE_LINES });
    expect((await admin.post(`/api/quotes/${(q.body as unknown as { id: string }).id}/send`)).status).toBe(422);
  });
});
