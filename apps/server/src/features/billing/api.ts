import { Router } from 'express';
import type { AppContext } from '../../context';
import { invoiceRoutes } from '../invoices';
import { mailOutboxRoutes } from '../mail';
import { quoteRoutes } from '../quotes';
import { billingRoutes } from './routes';

/** The signed-in billing API: settings, quotes, invoices, status e-mails and the development outbox. */
export function billingApiRoutes(ctx: AppContext): Router {
  const r = Router();
  r.use(billingRoutes(ctx), quoteRoutes(ctx), invoiceRoutes(ctx), mailOutboxRoutes(ctx));
  return r;
}
