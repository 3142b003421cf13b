import { Router } from 'express';
import { createJobRequest, idParams, jobDetailSchema, jobListQuery, jobListResponse, jobSchema, updateJobRequest } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createJob, findJobs, getJobDetail, updateJob } from './service';

export function jobRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs', requireRole(...ROLES.everyone), async (req, res) => {
    const query = parse(jobListQuery, req.query);
    res.json(jobListResponse.parse(await findJobs({ db: ctx.db, actor: actorOf(req), query })));
  });
  r.post('/jobs', requireRole(...ROLES.bench), async (req, res) => {
    const input = parse(createJobRequest, req.body);
    res.status(201).json(jobSchema.parse(await createJob({ db: ctx.db, actor: actorOf(req), input })));
  });
  r.get('/jobs/:id', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(jobDetailSchema.parse(await getJobDetail({ db: ctx.db, actor: actorOf(req), id })));
  });
  r.patch('/jobs/:id', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(updateJobRequest, req.body);
    res.json(jobSchema.parse(await updateJob({ db: ctx.db, actor: actorOf(req), id, input })));
  });
  return r;
}
