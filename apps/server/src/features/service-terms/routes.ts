import { Router } from 'express';
import { serviceTermsSchema, updateServiceTermsRequest } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { getServiceTerms, updateServiceTerms } from './service';

export function serviceTermsRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/service-terms', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(serviceTermsSchema.parse(await getServiceTerms(ctx.db, actorOf(req).shopId)));
  });
  // What the shop promises its customers and charges: the admin's call.
  r.patch('/service-terms', requireRole(...ROLES.admins), async (req, res) => {
    const input = parse(updateServiceTermsRequest, req.body);
    res.json(serviceTermsSchema.parse(await updateServiceTerms({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  return r;
}
