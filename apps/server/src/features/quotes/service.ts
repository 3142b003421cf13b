import { and, asc, eq } from 'drizzle-orm';
import type { createQuoteRequest, Quote, updateQuoteRequest } from '@splitscope/contract';
import type { z } from 'zod';
import type { Actor } from '../../auth/guards';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { auditLog, quoteLines, quotes } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { priceLines, toQuote } from '../billing/documents';
import { getBillingJob, jobSummary, recipientOf } from '../billing/jobs';
import { createCustomerLink } from '../billing/links';
import { getSettingsRow, takeNumber } from '../billing/settings';
import { quoteMail } from '../mail/templates';
import { sendMail } from '../mail/transport';

async function loadQuote(db: Db, shopId: string, id: string) {
  const [q] = await db.select().from(quotes).where(and(eq(quotes.id, id), eq(quotes.shopId, shopId)));
  if (!q) throw new AppError('not_found', `No quote ${id}`);
  const lines = await db.select().from(quoteLines).where(eq(quoteLines.quoteId, id)).orderBy(asc(quoteLines.position));
  return { q, lines };
}

export async function getQuote({ db, shopId, id }: { db: Db; shopId: string; id: string }): Promise<Quote> {
  const { q, lines } = await loadQuote(db, shopId, id);
  return toQuote(q, lines);
}

export async function createQuote({ db, actor, jobId, input }: { db: Db; actor: Actor; jobId: string; input: z.output<typeof createQuoteRequest> }) {
  const job = await getBillingJob(db, actor.shopId, jobId);
  if (job.status === 'returned') throw new AppError('conflict', `Job ${job.number} is already returned; no new quote`);
  const id = newId();
  await db.transaction(async (tx) => {
    const settings = await getSettingsRow(tx, actor.shopId);
    const rate = input.taxRate ?? settings.taxRateMilliPercent;
    const priced = priceLines(input.lines, rate);
    const number = await takeNumber(tx, actor.shopId, 'quote');
    await tx.insert(quotes).values({
      id,
      shopId: actor.shopId,
      jobId,
      customerId: job.customer.id,
      number,
      currency: settings.currency,
      taxRateMilliPercent: rate,
      subtotalCents: priced.totals.subtotalCents,
      taxCents: priced.totals.taxCents,
      totalCents: priced.totals.totalCents,
      note: input.note ?? null,
      createdBy: actor.id,
    });
    await tx.insert(quoteLines).values(priced.lines.map((l) => ({ ...l, quoteId: id })));
    await tx.insert(auditLog).values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'quote.create', subject: id, detail: number });
  });
  return getQuote({ db, shopId: actor.shopId, id });
}

/** Only a draft changes; a sent quote is what the customer saw, so a change is a new quote. */
export async function updateQuote({ db, actor, id, input }: { db: Db; actor: Actor; id: string; input: z.output<typeof updateQuoteRequest> }) {
  const { q } = await loadQuote(db, actor.shopId, id);
  if (q.status !== 'draft') throw new AppError('conflict', `Quote ${q.number} was already sent; make a new quote instead`);
  await db.transaction(async (tx) => {
    const rate = input.taxRate ?? q.taxRateMilliPercent;
    const set: Partial<typeof quotes.$inferInsert> = { taxRateMilliPercent: rate, updatedAt: new Date() };
    if (input.note !== undefined) set.note = input.note;
    if (input.lines) {
      const priced = priceLines(input.lines, rate);
      await tx.delete(quoteLines).where(eq(quoteLines.quoteId, id));
      await tx.insert(quoteLines).values(priced.lines.map((l) => ({ ...l, quoteId: id })));
      Object.assign(set, { subtotalCents: priced.totals.subtotalCents, taxCents: priced.totals.taxCents, totalCents: priced.totals.totalCents });
    } else if (input.taxRate !== undefined) {
      const lines = await tx.select().from(quoteLines).where(eq(quoteLines.quoteId, id)).orderBy(asc(quoteLines.position));
      const priced = priceLines(
        lines.map((l) => ({ ...l, quantity: l.quantityHundredths })),
        rate,
      );
      Object.assign(set, { subtotalCents: priced.totals.subtotalCents, taxCents: priced.totals.taxCents, totalCents: priced.totals.totalCents });
    }
    await tx.update(quotes).set(set).where(eq(quotes.id, id));
  });
  return getQuote({ db, shopId: actor.shopId, id });
}

/** E-mails the quote with a fresh customer link; a draft becomes sent. Sending again re-sends the same quote. */
export async function sendQuote({ db, config, actor, id, to }: { db: Db; config: Config; actor: Actor; id: string; to?: string }) {
  const { q, lines } = await loadQuote(db, actor.shopId, id);
  if (q.status === 'approved' || q.status === 'declined') throw new AppError('conflict', `Quote ${q.number} is already ${q.status}`);
  const job = await getBillingJob(db, actor.shopId, q.jobId);
  const address = recipientOf(job, to);
  const settings = await getSettingsRow(db, actor.shopId);
  const link = await createCustomerLink({ db, config, shopId: actor.shopId, jobId: job.id, validDays: settings.linkValidDays, createdBy: actor.id });
  const quote = toQuote(q, lines);
  const content = quoteMail(jobSummary(job), quote, link);
  const sent = await sendMail({ config, db, mail: { shopId: actor.shopId, jobId: job.id, kind: 'quote', to: address, replyTo: settings.replyTo, ...content } });
  await db
    .update(quotes)
    .set({ status: 'sent', sentAt: sent.sentAt, sentTo: address, updatedAt: new Date() })
    .where(eq(quotes.id, id));
  await db.insert(auditLog).values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'quote.send', subject: id, detail: address });
  return { mailId: sent.mailId, to: address, sentAt: sent.sentAt.toISOString() };
}
