// Quote and invoice rows to the contract shapes, and lines with their amounts computed by the contract's
// money functions (the one place the arithmetic lives).
import { asc, eq, inArray } from 'drizzle-orm';
import { computeTotals, formatQuantity, formatTaxRate, type BillingLine, type Invoice, type Quote } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { invoiceLines, invoices, quoteLines, quotes } from '../../db/schema';
import { iso, isoOrNull } from '../../lib/dates';
import { newId } from '../../lib/ids';

export interface LineValues {
  kind: 'part' | 'labour' | 'other';
  description: string;
  quantityHundredths: number;
  unitCents: number;
  taxable: boolean;
}

/** Parsed request lines (quantity already in hundredths) with amounts and the document totals. */
export function priceLines(lines: readonly { kind: LineValues['kind']; description: string; quantity: number; unitCents: number; taxable: boolean }[], rate: number) {
  const values: LineValues[] = lines.map((l) => ({ kind: l.kind, description: l.description, quantityHundredths: l.quantity, unitCents: l.unitCents, taxable: l.taxable }));
  const totals = computeTotals(values, rate);
  return { lines: values.map((l, i) => ({ ...l, position: i, amountCents: totals.lines[i]!, id: newId() })), totals };
}

type LineRow = typeof quoteLines.$inferSelect | typeof invoiceLines.$inferSelect;

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

export const toQuote = (q: typeof quotes.$inferSelect, lines: LineRow[]): Quote => ({
  id: q.id,
  jobId: q.jobId,
  number: q.number,
  status: q.status,
  currency: q.currency,
  taxRateMilliPercent: q.taxRateMilliPercent,
  taxRate: formatTaxRate(q.taxRateMilliPercent),
  subtotalCents: q.subtotalCents,
  taxCents: q.taxCents,
  totalCents: q.totalCents,
  lines: lines.map(toLine),
  note: q.note,
  customerApproval: q.customerApproval,
  decidedAt: isoOrNull(q.decidedAt),
  declineReason: q.declineReason,
  sentAt: isoOrNull(q.sentAt),
  sentTo: q.sentTo,
  createdAt: iso(q.createdAt),
});

export const toInvoice = (i: typeof invoices.$inferSelect, lines: LineRow[]): Invoice => ({
  id: i.id,
  jobId: i.jobId,
  quoteId: i.quoteId,
  number: i.number,
  status: i.status,
  currency: i.currency,
  taxRateMilliPercent: i.taxRateMilliPercent,
  taxRate: formatTaxRate(i.taxRateMilliPercent),
  subtotalCents: i.subtotalCents,
  taxCents: i.taxCents,
  totalCents: i.totalCents,
  lines: lines.map(toLine),
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
    .where(inArray(quoteLines.quoteId, rows.map((r) => r.id)))
    .orderBy(asc(quoteLines.position));
  return rows.map((q) => toQuote(q, lines.filter((l) => l.quoteId === q.id)));
}

/** All invoices of a job with their lines, oldest first. */
export async function findJobInvoices(db: Db, jobId: string): Promise<Invoice[]> {
  const rows = await db.select().from(invoices).where(eq(invoices.jobId, jobId)).orderBy(asc(invoices.issuedAt));
  if (!rows.length) return [];
  const lines = await db
    .select()
    .from(invoiceLines)
    .where(inArray(invoiceLines.invoiceId, rows.map((r) => r.id)))
    .orderBy(asc(invoiceLines.position));
  return rows.map((i) => toInvoice(i, lines.filter((l) => l.invoiceId === i.id)));
}
