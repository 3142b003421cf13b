// What other features may use of mail: they import it from here, never from the files inside.
export { localFakesOn } from './local';
export { mailOutboxRoutes } from './routes';
export { invitationMail, invoiceMail, paidMail, passwordResetMail, quoteDecisionMail, quoteMail, statusMail } from './templates';
export type { JobSummary } from './templates';
export { sendMail } from './transport';
export type { OutgoingMail } from './transport';
