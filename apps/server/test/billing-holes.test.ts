// Holes in the customer flow a probe found: the outbox showed every shop's mail, a quote's replacement was
// judged by creation time with old links left open, links went to any address typed, and an invoice could be
// paid through two checkouts with the second payment dropped.
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, customerLinks, invoices, paymentEvents, payments, quotes } from '../src/db/schema';
import { paymentsFor } from '../src/features/billing/payments';
import { createUser } from '../src/testing/factories';
import { linkIn, startBillingRig, type BillingRig } from './billing-fixture';
import { Client } from './harness';

let rig: BillingRig;
beforeAll(async () => {
  rig = await startBillingRig();
});
afterAll(() => rig?.close());

const line = (unitCents: number) => ({ lines: [{ kind: 'part', description: 'Fan-drive transistor', quantity: '1', unitCents }] });
const idOf = (r: { body: unknown }) => (r.body as { id: string }).id;
const tag = () => crypto.randomUUID().slice(0, 8);

describe('the mail outbox (hole 2)', () => {
  it("shows a shop admin only their own shop's messages", async () => {
    const { admin, makeJob, smtp, server, db } = rig;
    const email = `outbox.${tag()}@contractor.example.test`;
    const job = await makeJob({ customerName: 'Noor Outbox', email });
    const q = await admin.post(`/api/jobs/${job.id}/quotes`, line(2500));
    expect((await admin.post(`/api/quotes/${idOf(q)}/send`)).status).toBe(200);
    const sent = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)));

    const mine = (await admin.get('/api/dev/mail')).body as unknown as { items: { id: string }[] };
    expect(mine.items.some((i) => i.id === sent.id)).toBe(true);

    const password = 'other-shop-admin-pass';
    const otherAdmin = await createUser(db, { shopId: 'shop-other', role: 'admin', email: `admin.${tag()}@other.test`, password });
    const other = await new Client(server.url).signIn(otherAdmin.email, password);
    const theirs = await other.get('/api/dev/mail');
    expect(theirs.status).toBe(200);
    expect(JSON.stringify(theirs.body)).not.toContain(email);
    expect((theirs.body as unknown as { items: unknown[] }).items).toHaveLength(0);
    expect((await other.get(`/api/dev/mail/${sent.id}`)).status).toBe(404);
    expect((await admin.get(`/api/dev/mail/${sent.id}`)).status).toBe(200);
  });
});

describe('replaced quotes and old links (hole 4)', () => {
  it('lets the customer answer the quote sent last, and revokes the links sent before it', async () => {
    const { admin, makeJob, smtp } = rig;
    const email = `requote.${tag()}@contractor.example.test`;
    const job = await makeJob({ customerName: 'Kofi Requote', email });
    // written first, the dearer quote; then a cheaper one is sent first, and the dearer one after all
    const dear = (await admin.post(`/api/jobs/${job.id}/quotes`, line(9000))).body as unknown as { id: string; number: string };
    const cheap = (await admin.post(`/api/jobs/${job.id}/quotes`, line(4000))).body as unknown as { id: string; number: string };
    await admin.post(`/api/quotes/${cheap.id}/send`);
    const cheapToken = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.includes(cheap.number)));
    await admin.post(`/api/quotes/${dear.id}/send`);
    const dearToken = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.includes(dear.number)));

    const customer = new Client(rig.server.url);
    // the earlier link no longer opens anything
    expect((await customer.get(`/api/public/links/${cheapToken}`)).status).toBe(404);
    expect((await customer.post(`/api/public/links/${cheapToken}/quotes/${cheap.id}/approve`)).status).toBe(404);
    // through the live link, the quote sent first is replaced by the one sent last
    const old = await customer.post(`/api/public/links/${dearToken}/quotes/${cheap.id}/approve`);
    expect(old.status).toBe(409);
    expect(old.body).toMatchObject({ detail: `Quote ${cheap.number} was replaced by quote ${dear.number}` });
    expect((await customer.post(`/api/public/links/${dearToken}/quotes/${dear.id}/approve`)).status).toBe(200);
  });
});

describe('customer links go to the address on file (hole 5)', () => {
  it('refuses another address, and records who the approving link was mailed to', async () => {
    const { admin, makeJob, smtp, db } = rig;
    const email = `onfile.${tag()}@contractor.example.test`;
    const job = await makeJob({ customerName: 'Lena Onfile', email });
    const q = (await admin.post(`/api/jobs/${job.id}/quotes`, line(3100))).body as unknown as { id: string; number: string };
    const before = smtp.messages.length;
    const elsewhere = await admin.post(`/api/quotes/${q.id}/send`, { to: 'someone.else@example.test' });
    expect(elsewhere.status).toBe(422);
    expect(JSON.stringify(elsewhere.body)).toContain('address on file');
    expect((await admin.post(`/api/jobs/${job.id}/notify`, { to: 'someone.else@example.test' })).status).toBe(422);
    expect(await db.select().from(customerLinks).where(eq(customerLinks.jobId, job.id))).toHaveLength(0);
    expect(smtp.messages.length).toBe(before);

    // the address on file, typed in another case, is that address
    expect((await admin.post(`/api/quotes/${q.id}/send`, { to: email.toUpperCase() })).status).toBe(200);
    const token = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.includes(q.number)));
    const [link] = await db.select().from(customerLinks).where(eq(customerLinks.jobId, job.id));
    expect(link).toMatchObject({ recipientName: 'Lena Onfile', recipientEmail: email });

    expect((await new Client(rig.server.url).post(`/api/public/links/${token}/quotes/${q.id}/approve`)).status).toBe(200);
    const [stored] = await db.select().from(quotes).where(eq(quotes.id, q.id));
    expect(stored).toMatchObject({ customerApproval: 'approved', decidedViaLinkId: link!.id, decidedByEmail: email });
    expect((await admin.get(`/api/quotes/${q.id}`)).body).toMatchObject({ decidedByEmail: email });
    const [audit] = await db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.subject, q.id), eq(auditLog.action, 'quote.customer-approved')));
    expect(audit!.detail).toContain(`Lena Onfile <${email}>`);
  });
});

describe('one open checkout per invoice (hole 6)', () => {
  it('gives the open checkout again, and records a second payment as a refund due', async () => {
    const { admin, makeJob, smtp, db, pay, server, setStatus } = rig;
    const email = `checkout.${tag()}@contractor.example.test`;
    const job = await makeJob({ customerName: 'Omar Checkout', email });
    await setStatus(job.id, 'verified');
    const inv = (await admin.post(`/api/jobs/${job.id}/invoices`, line(7700))).body as unknown as { id: string; number: string; totalCents: number };
    const token = linkIn(await smtp.waitFor((m) => m.subject.startsWith(`Invoice ${inv.number}`)));
    const customer = new Client(server.url);
    const first = await customer.post(`/api/public/links/${token}/invoices/${inv.id}/checkout`);
    const [second, third] = await Promise.all([
      customer.post(`/api/public/links/${token}/invoices/${inv.id}/checkout`),
      customer.post(`/api/public/links/${token}/invoices/${inv.id}/checkout`),
    ]);
    expect(first.status).toBe(200);
    expect(second.body).toEqual(first.body);
    expect(third.body).toEqual(first.body);
    expect([...pay.sessions.values()].filter((s) => s.client_reference_id === inv.id)).toHaveLength(1);

    // a checkout opened some other way (another tab before the fix, the provider's dashboard) is paid too
    const stray = await paymentsFor(server.ctx.config).checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: inv.totalCents, product_data: { name: `Invoice ${inv.number}` } } }],
      client_reference_id: inv.id,
      metadata: { invoiceId: inv.id, shopId: 'shop-demo' },
      success_url: `${server.url}/c/${token}`,
    });
    const url = (first.body as unknown as { url: string }).url;
    expect((await fetch(`${url}/pay`, { method: 'POST', redirect: 'manual' })).status).toBe(303);
    expect((await fetch(`${pay.url}/checkout/${stray.id}/pay`, { method: 'POST', redirect: 'manual' })).status).toBe(303);

    const rows = await db.select().from(payments).where(eq(payments.invoiceId, inv.id));
    expect(rows).toHaveLength(2);
    expect(rows.filter((r) => r.refundDue)).toHaveLength(1);
    expect(rows.find((r) => r.refundDue)).toMatchObject({ checkoutSessionId: stray.id, amountCents: inv.totalCents });
    const events = await db.select().from(paymentEvents).where(eq(paymentEvents.invoiceId, inv.id));
    expect(events.map((e) => e.outcome).sort()).toEqual(['paid', 'refund-due']);
    const [flag] = await db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.subject, inv.id), eq(auditLog.action, 'invoice.refund-due')));
    expect(flag!.detail).toContain(stray.id);
    const [after] = await db.select().from(invoices).where(eq(invoices.id, inv.id));
    expect(after).toMatchObject({ status: 'paid', paidCents: inv.totalCents });
  });
});
