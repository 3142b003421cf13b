import { Router } from 'express';
import { createQuoteRequest, idParams, quoteSchema, sendRequest, sentResponse, updateQuoteRequest } from '@splitscope/contract';
import { z } from 'zod';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createQuote, getQuote, sendQuote, updateQuote } from './service';

const jobParams = z.object({ jobId: z.string().trim().min(1).max(100) });

export function quoteRoutes(ctx: AppContext): Router {
  const r = Router();
  r.post('/jobs/:jobId/quotes', requireRole(...ROLES.bench), async (req, res) => {
    const { jobId } = parse(jobParams, req.params);
    const input = parse(createQuoteRequest, req.body);
    res.status(201).json(quoteSchema.parse(await createQuote({ db: ctx.db, actor: actorOf(req), jobId, input })));
  });
  r.get('/quotes/:id', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(quoteSchema.parse(await getQuote({ db: ctx.db, shopId: actorOf(req).shopId, id })));
  });
  r.patch('/quotes/:id', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(updateQuoteRequest, req.body);
    res.json(quoteSchema.parse(await updateQuote({ db: ctx.db, actor: actorOf(req), id, input })));
  });
  r.post('/quotes/:id/send', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { to } = parse(sendRequest, req.body);
    res.json(sentResponse.parse(await sendQuote({ db: ctx.db, config: ctx.config, actor: actorOf(req), id, to })));
  });
  return r;
}
