import { Router } from 'express';
import { createInvoiceRequest, idParams, invoiceSchema, sendRequest, sentResponse } from '@splitscope/contract';
import { z } from 'zod';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createInvoice, getInvoice, sendInvoice } from './service';

const jobParams = z.object({ jobId: z.string().trim().min(1).max(100) });

export function invoiceRoutes(ctx: AppContext): Router {
  const r = Router();
  r.post('/jobs/:jobId/invoices', requireRole(...ROLES.bench), async (req, res) => {
    const { jobId } = parse(jobParams, req.params);
    const input = parse(createInvoiceRequest, req.body);
    res.status(201).json(invoiceSchema.parse(await createInvoice({ db: ctx.db, config: ctx.config, storage: ctx.storage, actor: actorOf(req), jobId, input })));
  });
  r.get('/invoices/:id', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(invoiceSchema.parse(await getInvoice({ db: ctx.db, shopId: actorOf(req).shopId, id })));
  });
  r.post('/invoices/:id/send', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { to } = parse(sendRequest, req.body);
    res.json(sentResponse.parse(await sendInvoice({ db: ctx.db, config: ctx.config, storage: ctx.storage, actor: actorOf(req), id, to })));
  });
  return r;
}
