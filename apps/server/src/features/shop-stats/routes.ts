import { Router } from 'express';
import { shopStatsResponse } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { shopStats } from './service';

export function shopStatsRoutes(ctx: AppContext): Router {
  const r = Router();
  // The lead's page: leads and admins.
  r.get('/stats', requireRole(...ROLES.reviewers), async (req, res) => {
    res.json(shopStatsResponse.parse(await shopStats({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  return r;
}
