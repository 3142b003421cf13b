import { Router } from 'express';
import { diagnosisResponse, diagnosisSnapshotListResponse, idParams } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { getJobRow } from '../jobs/service';
import { computeDiagnosis, findSnapshots } from './service';

export function diagnosisRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs/:id/diagnosis', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const job = await getJobRow(ctx.db, actorOf(req).shopId, id);
    res.json(diagnosisResponse.parse(await computeDiagnosis({ db: ctx.db, job })));
  });
  r.get('/jobs/:id/diagnosis-snapshots', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const job = await getJobRow(ctx.db, actorOf(req).shopId, id);
    res.json(diagnosisSnapshotListResponse.parse(await findSnapshots({ db: ctx.db, jobId: job.id })));
  });
  return r;
}
