import { and, asc, desc, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { reportReady, type BillingLineValues, type createInvoiceRequest, type Invoice } from '@splitscope/contract';
import type { z } from 'zod';
import type { Actor } from '../../auth/guards';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { invoiceLines, invoices, paymentEvents, payments, quoteLines, quotes } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import type { Storage } from '../../storage/storage';
import {
  auditBilling,
  createCustomerLink,
  getBillingJob,
  getSettingsRow,
  jobSummary,
  linesFromInput,
  linesFromRows,
  mailDocument,
  openDocument,
  paymentsFor,
  publicBase,
  toInvoice,
} from '../billing';
import { reportPdf } from '../reports';
import { invoiceMail, paidMail, sendMail } from '../mail';

async function loadInvoice(db: Db, shopId: string, id: string) {
  const [inv] = await db
    .select()
    .from(invoices)
    .where(and(eq(invoices.id, id), eq(invoices.shopId, shopId)));
  if (!inv) throw new AppError('not_found', `No invoice ${id}`);
  const lines = await db.select().from(invoiceLines).where(eq(invoiceLines.invoiceId, id)).orderBy(asc(invoiceLines.position));
  return { inv, lines };
}

export async function getInvoice({ db, shopId, id }: { db: Db; shopId: string; id: string }): Promise<Invoice> {
  const { inv, lines } = await loadInvoice(db, shopId, id);
  return toInvoice(inv, lines);
}

/** Issues the invoice of a verified job: the given lines, or the approved quote's. One open invoice per job. */
export async function createInvoice({
  db,
  config,
  storage,
  actor,
  jobId,
  input,
}: {
  db: Db;
  config: Config;
  storage: Storage;
  actor: Actor;
  jobId: string;
  input: z.output<typeof createInvoiceRequest>;
}): Promise<Invoice> {
  const job = await getBillingJob(db, actor.shopId, jobId);
  if (!reportReady(job.status)) {
    throw new AppError('conflict', `Job ${job.number} is ${job.status}; the invoice is issued after verification`, { allowed: ['verified', 'returned'] });
  }
  const [open] = await db
    .select({ number: invoices.number })
    .from(invoices)
    .where(and(eq(invoices.jobId, jobId), eq(invoices.status, 'issued')));
  if (open) throw new AppError('conflict', `Job ${job.number} already has the open invoice ${open.number}`);

  let quoteId: string | null = null;
  let source: BillingLineValues[];
  let quoteRate: number | null = null;
  if (input.lines) {
    source = linesFromInput(input.lines);
  } else {
    const where = input.quoteId
      ? and(eq(quotes.id, input.quoteId), eq(quotes.jobId, jobId), eq(quotes.shopId, actor.shopId))
      : and(eq(quotes.jobId, jobId), eq(quotes.status, 'approved'));
    const [q] = await db.select().from(quotes).where(where).orderBy(desc(quotes.decidedAt)).limit(1);
    if (!q)
      throw new AppError(
        'invalid',
        input.quoteId ? `No quote ${input.quoteId} on this job` : `Job ${job.number} has no approved quote; give the invoice lines`,
      );
    if (q.status !== 'approved') throw new AppError('conflict', `Quote ${q.number} is ${q.status}, not approved by the customer`);
    quoteId = q.id;
    quoteRate = q.taxRateMilliPercent;
    const lines = await db.select().from(quoteLines).where(eq(quoteLines.quoteId, q.id)).orderBy(asc(quoteLines.position));
    source = linesFromRows(lines);
  }

  const id = newId();
  await db.transaction(async (tx) => {
    const settings = await getSettingsRow(tx, actor.shopId);
    const rate = input.taxRate ?? quoteRate ?? settings.taxRateMilliPercent;
    const doc = await openDocument(tx, { shopId: actor.shopId, kind: 'invoice', lines: source, rate });
    await tx.insert(invoices).values({
      id,
      shopId: actor.shopId,
      jobId,
      customerId: job.customer.id,
      quoteId,
      number: doc.number,
      currency: settings.currency,
      ...doc.money,
      createdBy: actor.id,
    });
    await tx.insert(invoiceLines).values(doc.lines.map((l) => ({ ...l, invoiceId: id })));
    await auditBilling(tx, actor.shopId, actor, 'invoice.issue', id, doc.number);
  });
  if (input.send) await sendInvoice({ db, config, storage, actor, id });
  return getInvoice({ db, shopId: actor.shopId, id });
}

/** E-mails the invoice with a fresh customer link and the repair report attached as a PDF. */
export async function sendInvoice({ db, config, storage, actor, id, to }: { db: Db; config: Config; storage: Storage; actor: Actor; id: string; to?: string }) {
  const { inv, lines } = await loadInvoice(db, actor.shopId, id);
  if (inv.status === 'void') throw new AppError('conflict', `Invoice ${inv.number} is void`);
  const sent = await mailDocument({
    db,
    config,
    actor,
    jobId: inv.jobId,
    kind: 'invoice',
    to,
    render: async (job, link) => ({
      ...invoiceMail(jobSummary(job), toInvoice(inv, lines), link, true),
      attachments: [
        {
          filename: `repair-report-job-${job.number}.pdf`,
          content: await reportPdf({ db, storage, shopId: job.shopId, jobId: job.id }),
          contentType: 'application/pdf',
        },
      ],
    }),
  });
  await db.update(invoices).set({ sentAt: sent.sentAt }).where(eq(invoices.id, id));
  return { mailId: sent.mailId, to: sent.to, sentAt: sent.sentAt.toISOString() };
}

/** The invoice's checkout if the payment service still has it open (a 404 there: none; no answer: a 503). */
async function openCheckout(config: Config, sessionId: string): Promise<{ url: string } | null> {
  try {
    const s = await paymentsFor(config).checkout.sessions.retrieve(sessionId);
    return s.status === 'open' && s.url ? { url: s.url } : null;
  } catch (err) {
    if ((err as { statusCode?: number }).statusCode === 404) return null;
    console.error('payments: checkout session not retrieved:', (err as Error).message);
    throw new AppError('unavailable', 'The payment service is not answering; try again shortly.');
  }
}

/**
 * Opens a hosted checkout for an unpaid invoice of the link's job; the customer is sent to its URL. One open
 * checkout per invoice: while the last one is open its address is given again, so two tabs (or two people with
 * the link) cannot both pay. The invoice row stays locked meanwhile, so two requests at once open one checkout.
 */
export async function startCheckout({
  db,
  config,
  shopId,
  jobId,
  invoiceId,
  token,
}: {
  db: Db;
  config: Config;
  shopId: string;
  jobId: string;
  invoiceId: string;
  token: string;
}) {
  const { inv } = await loadInvoice(db, shopId, invoiceId);
  if (inv.jobId !== jobId) throw new AppError('not_found', `No invoice ${invoiceId}`);
  const job = await getBillingJob(db, shopId, jobId);
  const page = `${publicBase(config)}/c/${token}`;
  return db.transaction(async (tx) => {
    const [locked] = await tx
      .select({ status: invoices.status, checkoutSessionId: invoices.checkoutSessionId })
      .from(invoices)
      .where(eq(invoices.id, inv.id))
      .for('update');
    if (locked!.status !== 'issued') throw new AppError('conflict', `Invoice ${inv.number} is ${locked!.status}`);
    if (locked!.checkoutSessionId) {
      const open = await openCheckout(config, locked!.checkoutSessionId);
      if (open) return open;
    }
    let session: Stripe.Checkout.Session;
    try {
      session = await paymentsFor(config).checkout.sessions.create({
        mode: 'payment',
        line_items: [
          {
            quantity: 1,
            price_data: { currency: inv.currency, unit_amount: inv.totalCents, product_data: { name: `Invoice ${inv.number}, job ${job.number}` } },
          },
        ],
        client_reference_id: inv.id,
        customer_email: job.customer.email ?? undefined,
        metadata: { invoiceId: inv.id, shopId },
        success_url: `${page}?paid={CHECKOUT_SESSION_ID}`,
        cancel_url: page,
      });
    } catch (err) {
      console.error('payments: checkout session refused:', (err as Error).message);
      throw new AppError('unavailable', 'The payment service is not answering; try again shortly.');
    }
    if (!session.url) throw new AppError('unavailable', 'The payment service gave no checkout address');
    await tx.update(invoices).set({ checkoutSessionId: session.id }).where(eq(invoices.id, inv.id));
    return { url: session.url };
  });
}

export type PaymentOutcome = 'paid' | 'duplicate' | 'ignored' | 'unknown-invoice' | 'amount-mismatch' | 'already-paid' | 'refund-due';

/**
 * Applies one verified payment event. The event id is the primary key of payment_events: a redelivered
 * event conflicts on insert and changes nothing. The whole effect is one transaction.
 */
export async function applyPaymentEvent({ db, config, event }: { db: Db; config: Config; event: Stripe.Event }): Promise<PaymentOutcome> {
  const result = await db.transaction(async (tx) => {
    if (event.type !== 'checkout.session.completed') {
      const [row] = await tx.insert(paymentEvents).values({ eventId: event.id, type: event.type, outcome: 'ignored' }).onConflictDoNothing().returning();
      return { outcome: row ? ('ignored' as const) : ('duplicate' as const) };
    }
    const session = event.data.object;
    const invoiceId = session.metadata?.invoiceId ?? session.client_reference_id ?? '';
    const [inv] = await tx.select().from(invoices).where(eq(invoices.id, invoiceId)).for('update');
    let outcome: PaymentOutcome;
    if (!inv) outcome = 'unknown-invoice';
    // Money taken for an invoice that is already paid (a second checkout completed) or void: it is recorded,
    // not dropped, and owed back to the customer.
    else if (inv.status !== 'issued') outcome = session.payment_status === 'paid' ? 'refund-due' : 'already-paid';
    else if (session.payment_status !== 'paid' || session.amount_total !== inv.totalCents || session.currency !== inv.currency) outcome = 'amount-mismatch';
    else outcome = 'paid';
    const [row] = await tx
      .insert(paymentEvents)
      .values({ eventId: event.id, type: event.type, outcome, invoiceId: inv?.id ?? null })
      .onConflictDoNothing()
      .returning();
    if (!row) return { outcome: 'duplicate' as const };
    const paidAt = new Date(event.created * 1000);
    if (outcome === 'refund-due' && inv) {
      const paymentId = newId();
      await tx.insert(payments).values({
        id: paymentId,
        shopId: inv.shopId,
        invoiceId: inv.id,
        eventId: event.id,
        checkoutSessionId: session.id,
        amountCents: session.amount_total ?? 0,
        currency: session.currency ?? inv.currency,
        paidAt,
        refundDue: true,
      });
      const detail = `payment ${paymentId} of ${session.amount_total ?? 0} ${session.currency ?? ''} through checkout ${session.id} (event ${event.id}) on an invoice already ${inv.status}: refund it`;
      await auditBilling(tx, inv.shopId, null, 'invoice.refund-due', inv.id, detail);
      return { outcome, inv, detail };
    }
    if (outcome !== 'paid' || !inv) return { outcome };
    await tx.insert(payments).values({
      id: newId(),
      shopId: inv.shopId,
      invoiceId: inv.id,
      eventId: event.id,
      checkoutSessionId: session.id,
      amountCents: session.amount_total!,
      currency: session.currency!,
      paidAt,
    });
    await tx.update(invoices).set({ status: 'paid', paidAt, paidCents: session.amount_total! }).where(eq(invoices.id, inv.id));
    await auditBilling(tx, inv.shopId, null, 'invoice.paid', inv.id, event.id);
    return { outcome, inv };
  });
  if (result.outcome === 'amount-mismatch') console.error(`payments: event ${event.id} does not match its invoice; not marked paid`);
  if (result.outcome === 'refund-due' && 'detail' in result) console.error(`payments: invoice ${result.inv!.number} was paid twice; ${result.detail}`);
  if (result.outcome === 'paid' && 'inv' in result && result.inv) await mailReceipt(db, config, result.inv.shopId, result.inv.id);
  return result.outcome;
}

/** The receipt; a mail failure does not undo the payment (it is logged in mail_log). */
async function mailReceipt(db: Db, config: Config, shopId: string, invoiceId: string) {
  try {
    const { inv } = await loadInvoice(db, shopId, invoiceId);
    const job = await getBillingJob(db, shopId, inv.jobId);
    if (!job.customer.email) return;
    const settings = await getSettingsRow(db, shopId);
    const link = await createCustomerLink({ db, config, shopId, jobId: job.id, validDays: settings.linkValidDays, createdBy: null });
    const content = paidMail(jobSummary(job), inv, link);
    await sendMail({ config, db, mail: { shopId, jobId: job.id, kind: 'paid', to: job.customer.email, replyTo: settings.replyTo, ...content } });
  } catch (err) {
    console.error('mail: receipt not sent:', (err as Error).message);
  }
}
