// Quote and invoice rows to the contract shapes, and the reads of a job's documents. Pricing and numbering
// live in billing-document.ts.
import { asc, eq, inArray } from 'drizzle-orm';
import { formatQuantity, formatTaxRate, type BillingLine, type Invoice, type Quote } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { invoiceLines, invoices, quoteLines, quotes } from '../../db/schema';
import { iso, isoOrNull } from '../../lib/dates';

export type LineRow = typeof quoteLines.$inferSelect | typeof invoiceLines.$inferSelect;

const toLine = (l: LineRow): BillingLine => ({
  id: l.id,
  kind: l.kind,
  description: l.description,
  quantityHundredths: l.quantityHundredths,
  quantity: formatQuantity(l.quantityHundredths),
  unitCents: l.unitCents,
  amountCents: l.amountCents,
  taxable: l.taxable,
});

type HeadRow = Pick<typeof quotes.$inferSelect, 'id' | 'jobId' | 'number' | 'currency' | 'taxRateMilliPercent' | 'subtotalCents' | 'taxCents' | 'totalCents'>;

/** The fields both documents share (the contract's billingDocumentFields). */
const documentFields = (d: HeadRow, lines: LineRow[]) => ({
  id: d.id,
  jobId: d.jobId,
  number: d.number,
  currency: d.currency,
  taxRateMilliPercent: d.taxRateMilliPercent,
  taxRate: formatTaxRate(d.taxRateMilliPercent),
  subtotalCents: d.subtotalCents,
  taxCents: d.taxCents,
  totalCents: d.totalCents,
  lines: lines.map(toLine),
});

export const toQuote = (q: typeof quotes.$inferSelect, lines: LineRow[]): Quote => ({
  ...documentFields(q, lines),
  status: q.status,
  note: q.note,
  customerApproval: q.customerApproval,
  decidedAt: isoOrNull(q.decidedAt),
  declineReason: q.declineReason,
  decidedByEmail: q.decidedByEmail,
  sentAt: isoOrNull(q.sentAt),
  sentTo: q.sentTo,
  createdAt: iso(q.createdAt),
});

export const toInvoice = (i: typeof invoices.$inferSelect, lines: LineRow[]): Invoice => ({
  ...documentFields(i, lines),
  quoteId: i.quoteId,
  status: i.status,
  issuedAt: iso(i.issuedAt),
  sentAt: isoOrNull(i.sentAt),
  paidAt: isoOrNull(i.paidAt),
  paidCents: i.paidCents,
});

/** All quotes of a job with their lines, oldest first. */
export async function findJobQuotes(db: Db, jobId: string): Promise<Quote[]> {
  const rows = await db.select().from(quotes).where(eq(quotes.jobId, jobId)).orderBy(asc(quotes.createdAt));
  if (!rows.length) return [];
  const lines = await db
    .select()
    .from(quoteLines)
    .where(
      inArray(
        quoteLines.quoteId,
        rows.map((r) => r.id),
      ),
    )
    .orderBy(asc(quoteLines.position));
  return rows.map((q) =>
    toQuote(
      q,
      lines.filter((l) => l.quoteId === q.id),
    ),
  );
}

/** All invoices of a job with their lines, oldest first. */
export async function findJobInvoices(db: Db, jobId: string): Promise<Invoice[]> {
  const rows = await db.select().from(invoices).where(eq(invoices.jobId, jobId)).orderBy(asc(invoices.issuedAt));
  if (!rows.length) return [];
  const lines = await db
    .select()
    .from(invoiceLines)
    .where(
      inArray(
        invoiceLines.invoiceId,
        rows.map((r) => r.id),
      ),
    )
    .orderBy(asc(invoiceLines.position));
  return rows.map((i) =>
    toInvoice(
      i,
      lines.filter((l) => l.invoiceId === i.id),
    ),
  );
}
