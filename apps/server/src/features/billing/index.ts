// What other features may use of billing: they import it from here, never from the files inside.
export { auditBilling, linesFromInput, linesFromRows, mailDocument, openDocument, priceLines } from './billing-document';
export { findJobInvoices, findJobQuotes, toInvoice, toQuote } from './documents';
export { getBillingJob, jobSummary } from './jobs';
export { createCustomerLink, publicBase, resolveCustomerLink, revokeEarlierLinks } from './links';
export { paymentsFor } from './payments';
export { getSettingsRow } from './settings';
