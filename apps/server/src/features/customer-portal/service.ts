// What the customer sees and does through a link: one job, nothing else of the shop. Every query below is
// scoped by the link's shop and job; ids from the URL only ever narrow that scope.
import { and, eq, inArray, isNotNull, isNull, ne, sql } from 'drizzle-orm';
import { jobStatusLabels, moveOnEvent, reportReady, ROLES, type PublicJob } from '@splitscope/contract';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { auditLog, quotes, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { findJobInvoices, findJobQuotes, getBillingJob, getSettingsRow, jobSummary, resolveCustomerLink } from '../billing';
import { startCheckout } from '../invoices';
import { moveJob } from '../jobs';
import { reportPdf } from '../reports';
import { shopLogo } from '../shops';
import type { Storage } from '../../storage/storage';
import { quoteDecisionMail, sendMail } from '../mail';

export async function getPublicJob({ db, token }: { db: Db; token: string }): Promise<PublicJob> {
  const link = await resolveCustomerLink(db, token);
  const job = await getBillingJob(db, link.shopId, link.jobId);
  const quotesOfJob = (await findJobQuotes(db, job.id)).filter((q) => q.status !== 'draft');
  return {
    shop: job.shop,
    reference: `Job ${job.number}`,
    customerName: job.customer.name,
    board: job.boardName ? `${job.boardName} (${job.unitDescription})` : job.unitDescription,
    status: job.status,
    statusLabel: jobStatusLabels[job.status],
    reportAvailable: reportReady(job.status),
    expiresAt: link.expiresAt.toISOString(),
    quotes: quotesOfJob.map(({ sentTo: _sentTo, decidedByEmail: _by, ...q }) => q),
    invoices: await findJobInvoices(db, job.id),
  };
}

/** The shop's people who hear about a customer's answer: the reply-to address, else its admins and leads. */
async function shopRecipients(db: Db, shopId: string, replyTo: string | null): Promise<string[]> {
  if (replyTo) return [replyTo];
  const rows = await db
    .select({ email: users.email })
    .from(users)
    .where(and(eq(users.shopId, shopId), inArray(users.role, [...ROLES.reviewers])));
  return rows.map((r) => r.email);
}

/**
 * Records the customer's answer on a sent quote (once). Approval moves a job still at `received` on to
 * `diagnosing`, the flow's own next step; later steps stay with the shop (the lead's review approves the
 * repair). Either way the shop is told by e-mail.
 */
export async function decideQuote({
  db,
  config,
  token,
  quoteId,
  decision,
  reason,
}: {
  db: Db;
  config: Config;
  token: string;
  quoteId: string;
  decision: 'approved' | 'declined';
  reason: string | null;
}) {
  const link = await resolveCustomerLink(db, token);
  const [q] = await db
    .select()
    .from(quotes)
    .where(and(eq(quotes.id, quoteId), eq(quotes.jobId, link.jobId), eq(quotes.shopId, link.shopId)));
  if (!q || q.status === 'draft') throw new AppError('not_found', 'No such quote on this job');
  if (q.customerApproval) throw new AppError('conflict', `This quote was already ${q.customerApproval}`);
  // A quote sent after this one replaces it: the customer answers only the one they were sent last, so an old
  // price cannot be approved after the shop re-quoted. Send time, not creation time: a quote written first
  // and sent last is the shop's latest word. Compared in the database: a JS Date drops PostgreSQL's microseconds.
  const [newer] = await db
    .select({ number: quotes.number })
    .from(quotes)
    .where(
      and(
        eq(quotes.jobId, link.jobId),
        ne(quotes.id, q.id),
        isNotNull(quotes.sentAt),
        sql`${quotes.sentAt} > coalesce((select q2.sent_at from ${quotes} q2 where q2.id = ${q.id}), '-infinity'::timestamptz)`,
      ),
    )
    .limit(1);
  if (newer) throw new AppError('conflict', `Quote ${q.number} was replaced by quote ${newer.number}`);
  const now = new Date();
  const changed = await db.transaction(async (tx) => {
    const [row] = await tx
      .update(quotes)
      .set({
        status: decision,
        customerApproval: decision,
        decidedAt: now,
        declineReason: decision === 'declined' ? reason : null,
        // whose answer this is: the person and address the link was mailed to
        decidedViaLinkId: link.id,
        decidedByEmail: link.recipientEmail,
        updatedAt: now,
      })
      .where(and(eq(quotes.id, q.id), eq(quotes.status, 'sent'), isNull(quotes.customerApproval)))
      .returning({ id: quotes.id });
    if (!row) return false;
    const via = link.recipientEmail ? `${link.recipientName ?? 'the customer'} <${link.recipientEmail}>` : 'an unaddressed link';
    const detail = `through link ${link.id} mailed to ${via}${reason ? `; reason: ${reason}` : ''}`;
    await tx.insert(auditLog).values({ id: newId(), shopId: link.shopId, action: `quote.customer-${decision}`, subject: q.id, detail });
    if (decision === 'approved') {
      // Only a job still at the move's start moves; one the shop already took further stays where it is.
      const { from, to } = moveOnEvent('quote-approval');
      const audit = { action: 'job.status', detail: `${from} → ${to} (quote approved by the customer)` };
      await moveJob(tx, { jobId: link.jobId, shopId: link.shopId, from, to, by: { event: 'quote-approval' }, audit });
    }
    return true;
  });
  if (!changed) throw new AppError('conflict', 'This quote was already answered');

  const job = await getBillingJob(db, link.shopId, link.jobId);
  const settings = await getSettingsRow(db, link.shopId);
  const content = quoteDecisionMail(jobSummary(job), q, decision, reason);
  for (const to of await shopRecipients(db, link.shopId, settings.replyTo)) {
    try {
      await sendMail({ config, db, mail: { shopId: link.shopId, jobId: job.id, kind: 'quote-decision', to, ...content } });
    } catch {
      // logged in mail_log; the customer's answer is recorded regardless
    }
  }
  return getPublicJob({ db, token });
}

export async function getPublicReport({ db, storage, token }: { db: Db; storage: Storage; token: string }) {
  const link = await resolveCustomerLink(db, token);
  const job = await getBillingJob(db, link.shopId, link.jobId);
  if (!reportReady(job.status)) throw new AppError('not_found', 'The repair report is not ready yet');
  return { filename: `repair-report-job-${job.number}.pdf`, pdf: await reportPdf({ db, storage, shopId: link.shopId, jobId: job.id }) };
}

/** The logo of the link's shop, for the customer page's header. */
export async function getPublicLogo({ db, storage, token }: { db: Db; storage: Storage; token: string }) {
  const link = await resolveCustomerLink(db, token);
  const logo = await shopLogo({ db, storage, shopId: link.shopId });
  if (!logo) throw new AppError('not_found', 'This shop has no logo');
  return logo;
}

export async function startPublicCheckout({ db, config, token, invoiceId }: { db: Db; config: Config; token: string; invoiceId: string }) {
  const link = await resolveCustomerLink(db, token);
  return startCheckout({ db, config, shopId: link.shopId, jobId: link.jobId, invoiceId, token });
}
