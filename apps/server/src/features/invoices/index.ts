// What other features may use of invoices: they import it from here, never from the files inside.
export { invoiceRoutes } from './routes';
export { startCheckout } from './service';
export { paymentWebhookRoutes } from './webhook';
