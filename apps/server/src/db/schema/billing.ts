import { bigint, boolean, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { authorColumns, shops, users } from './auth';
import { customers } from './customers';
import { jobRowColumns, jobs } from './jobs';

// Money columns are integer cents (bigint, read as a JS number: the contract caps amounts well inside 2^53).
const cents = (name: string) => bigint(name, { mode: 'number' }).notNull();

export const quoteStatusEnum = pgEnum('quote_status', ['draft', 'sent', 'approved', 'declined']);
export const invoiceStatusEnum = pgEnum('invoice_status', ['issued', 'paid', 'void']);
export const billingLineKindEnum = pgEnum('billing_line_kind', ['part', 'labour', 'other']);
export const customerApprovalEnum = pgEnum('customer_approval', ['approved', 'declined']);

/** Per-shop billing settings and the running document numbers. */
export const billingSettings = pgTable('billing_settings', {
  shopId: text('shop_id')
    .primaryKey()
    .references(() => shops.id),
  currency: text('currency').notNull().default('usd'),
  /** thousandths of a percent: 8.25 % is 8250 */
  taxRateMilliPercent: integer('tax_rate_milli_percent').notNull().default(0),
  /** job statuses that send the customer a status e-mail */
  notifyOn: text('notify_on').array().notNull().default([]),
  /** status e-mails go out only for status changes after this moment (switching one on mails no history) */
  notifySince: timestamp('notify_since', { withTimezone: true }).notNull().defaultNow(),
  linkValidDays: integer('link_valid_days').notNull().default(30),
  replyTo: text('reply_to'),
  nextQuoteNumber: integer('next_quote_number').notNull().default(1),
  nextInvoiceNumber: integer('next_invoice_number').notNull().default(1),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export const quotes = pgTable(
  'quotes',
  {
    ...jobRowColumns(),
    customerId: text('customer_id')
      .notNull()
      .references(() => customers.id),
    number: text('number').notNull(),
    status: quoteStatusEnum('status').notNull().default('draft'),
    currency: text('currency').notNull(),
    taxRateMilliPercent: integer('tax_rate_milli_percent').notNull(),
    subtotalCents: cents('subtotal_cents'),
    taxCents: cents('tax_cents'),
    totalCents: cents('total_cents'),
    note: text('note'),
    customerApproval: customerApprovalEnum('customer_approval'),
    decidedAt: timestamp('decided_at', { withTimezone: true }),
    declineReason: text('decline_reason'),
    /** the customer link the answer came through, and the address that link was mailed to */
    decidedViaLinkId: text('decided_via_link_id'),
    decidedByEmail: text('decided_by_email'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    sentTo: text('sent_to'),
    ...authorColumns(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('quotes_shop_number_unique').on(t.shopId, t.number), index('quotes_job_idx').on(t.jobId, t.createdAt)],
);

export const quoteLines = pgTable(
  'quote_lines',
  {
    id: text('id').primaryKey(),
    quoteId: text('quote_id')
      .notNull()
      .references(() => quotes.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    kind: billingLineKindEnum('kind').notNull(),
    description: text('description').notNull(),
    quantityHundredths: integer('quantity_hundredths').notNull(),
    unitCents: cents('unit_cents'),
    amountCents: cents('amount_cents'),
    taxable: boolean('taxable').notNull().default(true),
  },
  (t) => [uniqueIndex('quote_lines_position_unique').on(t.quoteId, t.position)],
);

export const invoices = pgTable(
  'invoices',
  {
    ...jobRowColumns(),
    customerId: text('customer_id')
      .notNull()
      .references(() => customers.id),
    quoteId: text('quote_id').references(() => quotes.id),
    number: text('number').notNull(),
    status: invoiceStatusEnum('status').notNull().default('issued'),
    currency: text('currency').notNull(),
    taxRateMilliPercent: integer('tax_rate_milli_percent').notNull(),
    subtotalCents: cents('subtotal_cents'),
    taxCents: cents('tax_cents'),
    totalCents: cents('total_cents'),
    paidCents: bigint('paid_cents', { mode: 'number' }).notNull().default(0),
    /** the hosted checkout opened for it: reused while it is open, so an invoice has one open checkout at a time */
    checkoutSessionId: text('checkout_session_id'),
    issuedAt: timestamp('issued_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    paidAt: timestamp('paid_at', { withTimezone: true }),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id),
  },
  (t) => [uniqueIndex('invoices_shop_number_unique').on(t.shopId, t.number), index('invoices_job_idx').on(t.jobId, t.issuedAt)],
);

export const invoiceLines = pgTable(
  'invoice_lines',
  {
    id: text('id').primaryKey(),
    invoiceId: text('invoice_id')
      .notNull()
      .references(() => invoices.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    kind: billingLineKindEnum('kind').notNull(),
    description: text('description').notNull(),
    quantityHundredths: integer('quantity_hundredths').notNull(),
    unitCents: cents('unit_cents'),
    amountCents: cents('amount_cents'),
    taxable: boolean('taxable').notNull().default(true),
  },
  (t) => [uniqueIndex('invoice_lines_position_unique').on(t.invoiceId, t.position)],
);

/**
 * Every payment webhook event processed, keyed by the provider's event id: the primary key is what makes a
 * redelivered event a no-op (the insert conflicts and nothing else runs).
 */
export const paymentEvents = pgTable('payment_events', {
  eventId: text('event_id').primaryKey(),
  type: text('type').notNull(),
  /** what the event did: paid, ignored, amount-mismatch, unknown-invoice */
  outcome: text('outcome').notNull(),
  invoiceId: text('invoice_id').references(() => invoices.id),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
});

export const payments = pgTable(
  'payments',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    invoiceId: text('invoice_id')
      .notNull()
      .references(() => invoices.id),
    eventId: text('event_id')
      .notNull()
      .references(() => paymentEvents.eventId),
    checkoutSessionId: text('checkout_session_id').notNull(),
    amountCents: cents('amount_cents'),
    currency: text('currency').notNull(),
    paidAt: timestamp('paid_at', { withTimezone: true }).notNull().defaultNow(),
    /** a payment of an invoice already paid (a second checkout completed): the money is owed back */
    refundDue: boolean('refund_due').notNull().default(false),
  },
  (t) => [
    uniqueIndex('payments_event_unique').on(t.eventId),
    // one checkout session pays once, even if the provider sent two different events for it
    uniqueIndex('payments_session_unique').on(t.checkoutSessionId),
    index('payments_invoice_idx').on(t.invoiceId),
  ],
);

/** Links sent to customers: only the sha256 of the token is stored; the scope is one job. */
export const customerLinks = pgTable(
  'customer_links',
  {
    ...jobRowColumns(),
    tokenHash: text('token_hash').notNull(),
    /** who the link was mailed to (the customer's name and address on file at the time); null for older links */
    recipientName: text('recipient_name'),
    recipientEmail: text('recipient_email'),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
    createdBy: text('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('customer_links_token_unique').on(t.tokenHash), index('customer_links_job_idx').on(t.jobId)],
);

/** Every e-mail the server tried to send, with the outcome. */
export const mailLog = pgTable(
  'mail_log',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    jobId: text('job_id').references(() => jobs.id),
    /** quote, invoice, paid, declined, status:<milestone> */
    kind: text('kind').notNull(),
    to: text('to').notNull(),
    subject: text('subject').notNull(),
    messageId: text('message_id'),
    status: text('status').notNull(),
    error: text('error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('mail_log_job_idx').on(t.jobId, t.kind)],
);
