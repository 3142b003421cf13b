// What a quote and an invoice share: lines priced by the contract's money functions, a number from the shop's
// sequence, the header's money columns and the audit row. Each service keeps only its own header columns and
// its status rules, so the two documents cannot drift apart in how they count money.
import { computeTotals, type BillingLineValues, type BillingLinesInput } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { auditLog } from '../../db/schema';
import { newId } from '../../lib/ids';
import { type OutgoingMail, sendMail } from '../mail';
import type { LineRow } from './documents';
import { getBillingJob, recipientFor, recipientOf, type BillingJob } from './jobs';
import { createCustomerLink } from './links';
import { getSettingsRow, takeNumber, type Tx } from './settings';

/** Parsed request lines (quantity already in hundredths) as stored values. */
export const linesFromInput = (lines: BillingLinesInput): BillingLineValues[] =>
  lines.map((l) => ({ kind: l.kind, description: l.description, quantityHundredths: l.quantity, unitCents: l.unitCents, taxable: l.taxable }));

/** Stored lines as values again: to re-price at another rate, or to copy a quote's lines onto its invoice. */
export const linesFromRows = (rows: readonly LineRow[]): BillingLineValues[] =>
  rows.map((l) => ({ kind: l.kind, description: l.description, quantityHundredths: l.quantityHundredths, unitCents: l.unitCents, taxable: l.taxable }));

/** The lines with their amounts and positions, and the header's money columns at the rate. */
export function priceLines(values: readonly BillingLineValues[], rate: number) {
  const totals = computeTotals(values, rate);
  return {
    lines: values.map((l, i) => ({ ...l, position: i, amountCents: totals.lines[i]!, id: newId() })),
    money: { taxRateMilliPercent: rate, subtotalCents: totals.subtotalCents, taxCents: totals.taxCents, totalCents: totals.totalCents },
  };
}

/** Inside the caller's transaction: the next number of the kind, and the priced lines with the money columns. */
export async function openDocument(
  tx: Tx,
  { shopId, kind, lines, rate }: { shopId: string; kind: 'quote' | 'invoice'; lines: readonly BillingLineValues[]; rate: number },
) {
  const number = await takeNumber(tx, shopId, kind);
  return { number, ...priceLines(lines, rate) };
}

/** One audit row; `actor` is null for what the customer or the payment service did. */
export const auditBilling = (tx: Db | Tx, shopId: string, actor: Actor | null, action: string, subject: string, detail: string) =>
  tx.insert(auditLog).values({ id: newId(), shopId, userId: actor?.id ?? null, action, subject, detail });

/**
 * E-mails a document to the customer of its job with a fresh customer link, to the address on file (an
 * address asked for must be that one). `render` builds the message from the job and the link; the mail is logged by sendMail.
 */
export async function mailDocument({
  db,
  config,
  actor,
  jobId,
  kind,
  to,
  render,
}: {
  db: Db;
  config: Config;
  actor: Actor;
  jobId: string;
  kind: 'quote' | 'invoice';
  to: string | undefined;
  render: (job: BillingJob, link: { url: string; expiresAt: Date }) => Promise<Pick<OutgoingMail, 'subject' | 'text' | 'html' | 'attachments'>>;
}) {
  const job = await getBillingJob(db, actor.shopId, jobId);
  const address = recipientOf(job, to);
  const settings = await getSettingsRow(db, actor.shopId);
  const link = await createCustomerLink({
    db,
    config,
    shopId: actor.shopId,
    jobId: job.id,
    validDays: settings.linkValidDays,
    createdBy: actor.id,
    recipient: recipientFor(job, address),
  });
  const content = await render(job, link);
  const sent = await sendMail({ config, db, mail: { shopId: actor.shopId, jobId: job.id, kind, to: address, replyTo: settings.replyTo, ...content } });
  return { ...sent, to: address, linkId: link.id };
}
