import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import { checkoutResponse, declineQuoteRequest, publicJobSchema } from '@splitscope/contract';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { AppError, parse } from '../../http/errors';
import { decideQuote, getPublicJob, getPublicLogo, getPublicReport, startPublicCheckout } from './service';

const tokenParams = z.object({ token: z.string().max(200) });
const docParams = tokenParams.extend({ id: z.string().trim().min(1).max(100) });

/** The customer page's API: no sign-in, the link's token is the only credential. Mounted under /public. */
export function customerPortalRoutes(ctx: AppContext): Router {
  const r = Router();
  // Guessing 256-bit tokens is hopeless anyway; the limit keeps a scanner from costing database work.
  r.use(
    '/public',
    rateLimit({
      windowMs: 60_000,
      limit: 120,
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      handler: () => {
        throw new AppError('rate_limited', 'Too many requests from this address; wait a minute and try again');
      },
    }),
  );
  r.use('/public', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('Referrer-Policy', 'no-referrer');
    next();
  });
  r.get('/public/links/:token', async (req, res) => {
    const { token } = parse(tokenParams, req.params);
    res.json(publicJobSchema.parse(await getPublicJob({ db: ctx.db, token })));
  });
  r.post('/public/links/:token/quotes/:id/approve', async (req, res) => {
    const { token, id } = parse(docParams, req.params);
    res.json(publicJobSchema.parse(await decideQuote({ db: ctx.db, config: ctx.config, token, quoteId: id, decision: 'approved', reason: null })));
  });
  r.post('/public/links/:token/quotes/:id/decline', async (req, res) => {
    const { token, id } = parse(docParams, req.params);
    const { reason } = parse(declineQuoteRequest, req.body ?? {});
    res.json(publicJobSchema.parse(await decideQuote({ db: ctx.db, config: ctx.config, token, quoteId: id, decision: 'declined', reason: reason ?? null })));
  });
  r.get('/public/links/:token/report.pdf', async (req, res) => {
    const { token } = parse(tokenParams, req.params);
    const { filename, pdf } = await getPublicReport({ db: ctx.db, storage: ctx.storage, token });
    res.type('application/pdf').setHeader('Content-Disposition', `inline; filename="${filename}"`);
    res.send(pdf);
  });
  r.get('/public/links/:token/logo', async (req, res) => {
    const { token } = parse(tokenParams, req.params);
    const { contentType, bytes } = await getPublicLogo({ db: ctx.db, storage: ctx.storage, token });
    res.type(contentType).send(bytes);
  });
  r.post('/public/links/:token/invoices/:id/checkout', async (req, res) => {
    const { token, id } = parse(docParams, req.params);
    res.json(checkoutResponse.parse(await startPublicCheckout({ db: ctx.db, config: ctx.config, token, invoiceId: id })));
  });
  return r;
}
