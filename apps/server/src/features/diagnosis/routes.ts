import { Router, type Request, type Response } from 'express';
import { diagnosisResponse, diagnosisSnapshotListResponse, idParams, type Diagnosis } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { getJobRow } from '../../db/job-row';
import { findSnapshots, getDiagnosis } from './service';

// A diagnosis is kept frozen and shared while the job's readings stay the same, so it is checked against the
// contract, serialized and given its ETag once, not again for every poll of the same readings (a long history
// is a body of 100 kB and more).
const bodies = new WeakMap<Diagnosis, { body: Buffer; etag: string | undefined }>();
function sendDiagnosis(req: Request, res: Response, d: Diagnosis): void {
  let sent = bodies.get(d);
  if (!sent) {
    const body = Buffer.from(JSON.stringify(diagnosisResponse.parse(d)), 'utf8');
    const etagFn = req.app.get('etag fn') as ((body: Buffer, encoding?: string) => string | undefined) | undefined;
    bodies.set(d, (sent = { body, etag: etagFn?.(body) }));
  }
  res.set('Content-Type', 'application/json; charset=utf-8');
  if (sent.etag) res.set('ETag', sent.etag);
  res.send(sent.body);
}

export function diagnosisRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs/:id/diagnosis', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    sendDiagnosis(req, res, await getDiagnosis({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id }));
  });
  r.get('/jobs/:id/diagnosis-snapshots', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const job = await getJobRow(ctx.db, actorOf(req).shopId, id);
    res.json(diagnosisSnapshotListResponse.parse(await findSnapshots({ db: ctx.db, jobId: job.id })));
  });
  return r;
}
