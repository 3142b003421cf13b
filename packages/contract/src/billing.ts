import { z } from 'zod';
import { idSchema, isoDateTime } from './common';
import { shopCardSchema } from './shop';

// ---------------------------------------------------------------------------------------------------------
// Money. Amounts are integer cents everywhere (never a float). Quantities are integer hundredths ("1.5" h of
// labour is 150), tax rates integer thousandths of a percent (8.875 % is 8875).
//
// Rounding rule: round half away from zero, applied
//   - once per line (quantity × unit price, which can carry fractions of a cent when the quantity does), and
//   - once per document on the taxable subtotal (never per line, so the tax does not drift with the number
//     of lines).
// Why half away from zero and not half-even: each document is rounded once, and a customer checking an
// invoice by hand expects half a cent to go up, which is also how sales-tax and VAT guidance usually
// describes it. Half-even only pays off when many roundings are summed, which per-document rounding avoids.
// The arithmetic is done in BigInt so no intermediate product loses precision.
// ---------------------------------------------------------------------------------------------------------

export const MAX_CENTS = 100_000_000_000; // a billion in major units: far beyond any board repair
export const MAX_TAX_RATE_MILLI_PERCENT = 100_000; // 100 %

/** n / d rounded to the nearest integer, halves away from zero. `d` must be positive. */
export function divRoundHalfAwayFromZero(n: bigint, d: bigint): bigint {
  if (d <= 0n) throw new RangeError('divisor must be positive');
  const neg = n < 0n;
  const a = neg ? -n : n;
  const q = a / d;
  const r = a % d;
  const rounded = r * 2n >= d ? q + 1n : q;
  return neg ? -rounded : rounded;
}

function toSafe(n: bigint): number {
  const v = Number(n);
  if (!Number.isSafeInteger(v) || Math.abs(v) > MAX_CENTS) throw new RangeError('amount out of range');
  return v;
}

/** quantity (hundredths) × unit price (cents), rounded to the cent half away from zero. */
export function lineAmountCents(quantityHundredths: number, unitCents: number): number {
  assertInt(quantityHundredths, 'quantity');
  assertInt(unitCents, 'unit price');
  return toSafe(divRoundHalfAwayFromZero(BigInt(quantityHundredths) * BigInt(unitCents), 100n));
}

/** Tax on a taxable subtotal at a rate in thousandths of a percent, rounded once, half away from zero. */
export function taxCents(taxableCents: number, rateMilliPercent: number): number {
  assertInt(taxableCents, 'taxable subtotal');
  assertInt(rateMilliPercent, 'tax rate');
  return toSafe(divRoundHalfAwayFromZero(BigInt(taxableCents) * BigInt(rateMilliPercent), 100_000n));
}

function assertInt(v: number, what: string) {
  if (!Number.isSafeInteger(v)) throw new RangeError(`${what} must be an integer`);
}

export interface LineForTotals {
  quantityHundredths: number;
  unitCents: number;
  taxable: boolean;
}

export interface Totals {
  lines: number[];
  subtotalCents: number;
  taxableCents: number;
  taxCents: number;
  totalCents: number;
}

/** The totals of a quote or an invoice: per-line amounts, subtotal, tax (one rounding), total. */
export function computeTotals(lines: readonly LineForTotals[], rateMilliPercent: number): Totals {
  const amounts = lines.map((l) => lineAmountCents(l.quantityHundredths, l.unitCents));
  const subtotal = amounts.reduce((s, a) => s + a, 0);
  const taxable = amounts.reduce((s, a, i) => (lines[i]!.taxable ? s + a : s), 0);
  const tax = taxCents(taxable, rateMilliPercent);
  return { lines: amounts, subtotalCents: toSafe(BigInt(subtotal)), taxableCents: taxable, taxCents: tax, totalCents: toSafe(BigInt(subtotal + tax)) };
}

/** Typed decimal text → an integer count of 10^-places units, without going through a float. */
function parseFixed(text: string, digits: number, places: number, shape: string): number {
  const m = new RegExp(`^(\\d{1,${digits}})(?:\\.(\\d{1,${places}}))?$`).exec(text.trim());
  if (!m) throw new RangeError(shape);
  return Number(m[1]) * 10 ** places + Number((m[2] ?? '').padEnd(places, '0'));
}

/** An integer count of 10^-places units → the shortest decimal ("1.5", "2"). */
function formatFixed(units: number, places: number): string {
  const one = 10 ** places;
  const frac = String(units % one)
    .padStart(places, '0')
    .replace(/0+$/, '');
  return frac ? `${Math.trunc(units / one)}.${frac}` : String(Math.trunc(units / one));
}

/** "8.875" (percent) → 8875; at most three decimals. */
export function parseTaxRate(percent: string): number {
  const v = parseFixed(percent, 3, 3, 'tax rate must look like 8.25');
  if (v > MAX_TAX_RATE_MILLI_PERCENT) throw new RangeError('tax rate must be at most 100 %');
  return v;
}

/** 8875 → "8.875", 8000 → "8". */
export const formatTaxRate = (milliPercent: number): string => formatFixed(milliPercent, 3);

/** "1.5" → 150; at most two decimals. */
export const parseQuantity = (text: string): number => parseFixed(text, 6, 2, 'quantity must look like 1 or 1.5');

/** 150 → "1.5", 200 → "2". */
export const formatQuantity = (hundredths: number): string => formatFixed(hundredths, 2);

/** "12.50" / "12.5" / "12" (major units) → 1250 cents, without going through a float. */
export const parseMoney = (text: string): number => parseFixed(text, 9, 2, 'amount must look like 12.50');

/** 1250 → "12.50": cents as the decimal a person types back into a price field. */
export function centsToDecimal(cents: number): string {
  assertInt(cents, 'amount');
  const a = Math.abs(cents);
  return `${cents < 0 ? '-' : ''}${Math.trunc(a / 100)}.${String(a % 100).padStart(2, '0')}`;
}

/** 123456 → "1,234.56" with the currency code, e.g. "USD 1,234.56". */
export function formatMoney(cents: number, currency: string): string {
  const neg = cents < 0;
  const a = Math.abs(cents);
  const major = Math.trunc(a / 100)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return `${neg ? '-' : ''}${currency.toUpperCase()} ${major}.${String(a % 100).padStart(2, '0')}`;
}

// ---------------------------------------------------------------------------------------------------------
// Schemas
// ---------------------------------------------------------------------------------------------------------

const cents = z.number().int().min(0).max(MAX_CENTS);

export const lineKinds = ['part', 'labour', 'other'] as const;
export const lineKindSchema = z.enum(lineKinds);
export type LineKind = z.infer<typeof lineKindSchema>;

/** Quantity text as the API takes it ("1", "1.5"): exported for forms that validate before sending. */
export const quantityPattern = /^\d{1,6}(\.\d{1,2})?$/;
/** Tax-rate text as the API takes it ("8.25"). */
export const taxRatePattern = /^\d{1,3}(\.\d{1,3})?$/;

const quantityText = z
  .string()
  .trim()
  .regex(quantityPattern, 'quantity must look like 1 or 1.5')
  .transform(parseQuantity)
  .refine((q) => q > 0, 'quantity must be more than 0');

/** A price typed in the shop's currency ("12.50") → integer cents, never through a float. */
export const moneyText = z
  .string()
  .trim()
  .regex(/^\d{1,9}(\.\d{1,2})?$/, 'An amount like 12.50')
  .transform(parseMoney)
  .refine((c) => c <= MAX_CENTS, 'Amount too large');

// The range is checked before the text is turned into a number: `parseTaxRate` throws above 100 %, and a throw
// inside a transform is a server error, not the client's 422.
const taxRateText = z
  .string()
  .trim()
  .regex(taxRatePattern, 'tax rate must look like 8.25')
  .refine((t) => Number(t) <= MAX_TAX_RATE_MILLI_PERCENT / 1000, 'tax rate must be at most 100 %')
  .transform(parseTaxRate);

export const billingLineInput = z.object({
  kind: lineKindSchema,
  description: z.string().trim().min(1).max(300),
  /** decimal text, e.g. "1.5" (hours of labour) or "2" (parts) */
  quantity: quantityText,
  unitCents: cents,
  taxable: z.boolean().default(true),
});
export type BillingLineInput = z.input<typeof billingLineInput>;

/**
 * The largest subtotal a document may have: with tax at the highest rate (100 %) the total still fits
 * MAX_CENTS, so no tax rate chosen later can price a stored document out of range.
 */
export const MAX_SUBTOTAL_CENTS = MAX_CENTS / 2;

/** The lines of a quote or an invoice: one schema for both documents. */
export const billingLinesInput = z
  .array(billingLineInput)
  .min(1)
  .max(100)
  .refine(
    // In BigInt: a quantity of 999,999.99 at the largest unit price is past 2^53 and would lose digits. The
    // margin of one unit covers each line's rounding to the cent (at most half a cent a line, 100 lines).
    (lines) => lines.reduce((s, l) => s + BigInt(l.quantity) * BigInt(l.unitCents), 0n) <= BigInt(MAX_SUBTOTAL_CENTS - 100) * 100n,
    `the lines add up to more than ${formatMoney(MAX_SUBTOTAL_CENTS - 100, '').trim()} in the shop's currency`,
  );
export type BillingLinesInput = z.output<typeof billingLinesInput>;

/** A line as stored and priced (quantity in hundredths); what `computeTotals` takes. */
export type BillingLineValues = Pick<z.output<typeof billingLineInput>, 'kind' | 'description' | 'unitCents' | 'taxable'> & LineForTotals;

export const billingLineSchema = z.object({
  id: idSchema,
  kind: lineKindSchema,
  description: z.string(),
  quantityHundredths: z.number().int(),
  quantity: z.string(),
  unitCents: z.number().int(),
  amountCents: z.number().int(),
  taxable: z.boolean(),
});
export type BillingLine = z.infer<typeof billingLineSchema>;

/** The fields a quote and an invoice share: money in integer cents and their priced lines. */
const billingDocumentFields = {
  id: idSchema,
  jobId: idSchema,
  number: z.string(),
  currency: z.string(),
  taxRateMilliPercent: z.number().int(),
  taxRate: z.string(),
  subtotalCents: z.number().int(),
  taxCents: z.number().int(),
  totalCents: z.number().int(),
  lines: z.array(billingLineSchema),
};

export const quoteStatuses = ['draft', 'sent', 'approved', 'declined'] as const;
export const quoteStatusSchema = z.enum(quoteStatuses);
export type QuoteStatus = z.infer<typeof quoteStatusSchema>;

export const quoteSchema = z.object({
  ...billingDocumentFields,
  status: quoteStatusSchema,
  note: z.string().nullable(),
  /** the customer's answer on the customer page: recorded here, the job's own status flow is untouched */
  customerApproval: z.enum(['approved', 'declined']).nullable(),
  decidedAt: isoDateTime.nullable(),
  declineReason: z.string().nullable(),
  /** the address the customer link that carried the answer was mailed to (the shop's record of who answered) */
  decidedByEmail: z.string().nullable(),
  sentAt: isoDateTime.nullable(),
  sentTo: z.string().nullable(),
  createdAt: isoDateTime,
});
export type Quote = z.infer<typeof quoteSchema>;

export const createQuoteRequest = z.object({
  lines: billingLinesInput,
  /** percent text; the shop's default rate when omitted */
  taxRate: taxRateText.optional(),
  note: z
    .string()
    .trim()
    .max(2000)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional(),
});
export type CreateQuoteRequest = z.input<typeof createQuoteRequest>;

export const updateQuoteRequest = createQuoteRequest.partial();
export type UpdateQuoteRequest = z.input<typeof updateQuoteRequest>;

export const invoiceStatuses = ['issued', 'paid', 'void'] as const;
export const invoiceStatusSchema = z.enum(invoiceStatuses);
export type InvoiceStatus = z.infer<typeof invoiceStatusSchema>;

export const invoiceSchema = z.object({
  ...billingDocumentFields,
  quoteId: idSchema.nullable(),
  status: invoiceStatusSchema,
  issuedAt: isoDateTime,
  sentAt: isoDateTime.nullable(),
  paidAt: isoDateTime.nullable(),
  paidCents: z.number().int(),
});
export type Invoice = z.infer<typeof invoiceSchema>;

/** Issue an invoice: from the approved quote's lines when `lines` is omitted. */
export const createInvoiceRequest = z.object({
  quoteId: idSchema.optional(),
  lines: billingLinesInput.optional(),
  taxRate: taxRateText.optional(),
  /** e-mail it to the customer with the customer-page link at once (default) */
  send: z.boolean().default(true),
});
export type CreateInvoiceRequest = z.input<typeof createInvoiceRequest>;

export const jobBillingResponse = z.object({
  jobId: idSchema,
  quotes: z.array(quoteSchema),
  invoices: z.array(invoiceSchema),
});
export type JobBilling = z.infer<typeof jobBillingResponse>;

/** Milestones the shop can switch status e-mails on for; they follow the job flow. */
export const mailMilestones = ['received', 'diagnosing', 'approved', 'repaired', 'verified', 'returned'] as const;
export const mailMilestoneSchema = z.enum(mailMilestones);
export type MailMilestone = z.infer<typeof mailMilestoneSchema>;

export const billingSettingsSchema = z.object({
  currency: z.string(),
  taxRateMilliPercent: z.number().int(),
  taxRate: z.string(),
  notifyOn: z.array(mailMilestoneSchema),
  linkValidDays: z.number().int(),
  replyTo: z.string().nullable(),
});
export type BillingSettings = z.infer<typeof billingSettingsSchema>;

export const updateBillingSettingsRequest = z.object({
  currency: z
    .string()
    .trim()
    .toLowerCase()
    .regex(/^[a-z]{3}$/, 'a three-letter currency code')
    .optional(),
  taxRate: taxRateText.optional(),
  notifyOn: z.array(mailMilestoneSchema).max(mailMilestones.length).optional(),
  linkValidDays: z.number().int().min(1).max(365).optional(),
  replyTo: z
    .union([z.literal(''), z.string().trim().toLowerCase().email().max(254)])
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional(),
});
export type UpdateBillingSettingsRequest = z.input<typeof updateBillingSettingsRequest>;

export const sendRequest = z.object({
  /** defaults to the customer's e-mail on file */
  to: z.string().trim().toLowerCase().email().max(254).optional(),
});
export type SendRequest = z.input<typeof sendRequest>;

export const sentResponse = z.object({ mailId: idSchema, to: z.string(), sentAt: isoDateTime });
export type Sent = z.infer<typeof sentResponse>;

// --- the customer page (no sign-in; everything scoped to the job of the link) --------------------------

export const publicJobSchema = z.object({
  shop: shopCardSchema,
  reference: z.string(),
  customerName: z.string(),
  board: z.string().nullable(),
  status: z.string(),
  statusLabel: z.string(),
  reportAvailable: z.boolean(),
  expiresAt: isoDateTime,
  quotes: z.array(quoteSchema.omit({ sentTo: true, decidedByEmail: true })),
  invoices: z.array(invoiceSchema),
});
export type PublicJob = z.infer<typeof publicJobSchema>;

export const declineQuoteRequest = z.object({
  reason: z
    .string()
    .trim()
    .max(2000)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional(),
});

export const checkoutResponse = z.object({ url: z.string().url() });
export type Checkout = z.infer<typeof checkoutResponse>;

// --- captured mail (development only: what the local SMTP capture server received) ----------------------

export const capturedMailSummary = z.object({
  id: z.string(),
  receivedAt: isoDateTime,
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  attachments: z.array(z.object({ filename: z.string(), contentType: z.string(), size: z.number().int() })),
});
export type CapturedMailSummary = z.infer<typeof capturedMailSummary>;

export const capturedMailSchema = capturedMailSummary.extend({ text: z.string().nullable(), html: z.string().nullable() });
export type CapturedMail = z.infer<typeof capturedMailSchema>;

export const capturedMailListResponse = z.object({ items: z.array(capturedMailSummary) });
