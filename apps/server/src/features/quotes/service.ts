import { and, asc, eq } from 'drizzle-orm';
import type { createQuoteRequest, Quote, updateQuoteRequest } from '@splitscope/contract';
import type { z } from 'zod';
import type { Actor } from '../../auth/guards';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { quoteLines, quotes } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import {
  auditBilling,
  getBillingJob,
  getSettingsRow,
  jobSummary,
  linesFromInput,
  linesFromRows,
  mailDocument,
  openDocument,
  priceLines,
  revokeEarlierLinks,
  toQuote,
} from '../billing';
import { quoteMail } from '../mail';

async function loadQuote(db: Db, shopId: string, id: string) {
  const [q] = await db
    .select()
    .from(quotes)
    .where(and(eq(quotes.id, id), eq(quotes.shopId, shopId)));
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
    const doc = await openDocument(tx, { shopId: actor.shopId, kind: 'quote', lines: linesFromInput(input.lines), rate });
    await tx.insert(quotes).values({
      id,
      shopId: actor.shopId,
      jobId,
      customerId: job.customer.id,
      number: doc.number,
      currency: settings.currency,
      ...doc.money,
      note: input.note ?? null,
      createdBy: actor.id,
    });
    await tx.insert(quoteLines).values(doc.lines.map((l) => ({ ...l, quoteId: id })));
    await auditBilling(tx, actor.shopId, actor, 'quote.create', id, doc.number);
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
    if (input.lines || input.taxRate !== undefined) {
      // New lines, or the same lines at a new rate: either way the totals are computed again, once.
      const values = input.lines
        ? linesFromInput(input.lines)
        : linesFromRows(await tx.select().from(quoteLines).where(eq(quoteLines.quoteId, id)).orderBy(asc(quoteLines.position)));
      const priced = priceLines(values, rate);
      if (input.lines) {
        await tx.delete(quoteLines).where(eq(quoteLines.quoteId, id));
        await tx.insert(quoteLines).values(priced.lines.map((l) => ({ ...l, quoteId: id })));
      }
      Object.assign(set, priced.money);
    }
    await tx.update(quotes).set(set).where(eq(quotes.id, id));
  });
  return getQuote({ db, shopId: actor.shopId, id });
}

/** E-mails the quote with a fresh customer link; a draft becomes sent. Sending again re-sends the same quote. */
export async function sendQuote({ db, config, actor, id, to }: { db: Db; config: Config; actor: Actor; id: string; to?: string }) {
  const { q, lines } = await loadQuote(db, actor.shopId, id);
  if (q.status === 'approved' || q.status === 'declined') throw new AppError('conflict', `Quote ${q.number} is already ${q.status}`);
  const sent = await mailDocument({
    db,
    config,
    actor,
    jobId: q.jobId,
    kind: 'quote',
    to,
    render: async (job, link) => quoteMail(jobSummary(job), toQuote(q, lines), link),
  });
  const address = sent.to;
  await db.update(quotes).set({ status: 'sent', sentAt: sent.sentAt, sentTo: address, updatedAt: new Date() }).where(eq(quotes.id, id));
  // The links mailed before this quote offered what it replaces: only the link in this mail stays open.
  const revoked = await revokeEarlierLinks(db, q.jobId, sent.linkId);
  await auditBilling(db, actor.shopId, actor, 'quote.send', id, `${address}${revoked ? `; ${revoked} earlier link(s) revoked` : ''}`);
  return { mailId: sent.mailId, to: address, sentAt: sent.sentAt.toISOString() };
}
