import { Router } from 'express';
import { idParams, repairReportSchema } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { getRepairReport } from './service';

export function reportRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs/:id/report', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(repairReportSchema.parse(await getRepairReport({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  return r;
}
