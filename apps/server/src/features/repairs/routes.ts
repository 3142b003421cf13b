import { Router } from 'express';
import { createRepairRequest, idParams, repairListResponse, repairSchema } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createRepair, findRepairs } from './service';

export function repairRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs/:id/repairs', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(repairListResponse.parse(await findRepairs({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  r.post('/jobs/:id/repairs', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(createRepairRequest, req.body);
    res.status(201).json(repairSchema.parse(await createRepair({ db: ctx.db, actor: actorOf(req), jobId: id, input })));
  });
  return r;
}
