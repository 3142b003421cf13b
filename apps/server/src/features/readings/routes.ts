import { Router } from 'express';
import { createReadingRequest, createReadingResponse, idParams, readingListQuery, readingListResponse } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createReading, findReadings } from './service';

export function readingRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs/:id/readings', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { view, phase } = parse(readingListQuery, req.query);
    res.json(readingListResponse.parse(await findReadings({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id, view, phase })));
  });
  r.post('/jobs/:id/readings', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(createReadingRequest, req.body);
    const body = createReadingResponse.parse(await createReading({ db: ctx.db, actor: actorOf(req), jobId: id, input }));
    // Written out directly: `res.json` would also hash the body for an ETag, which no client of a POST uses and
    // which is a measurable part of the busiest write.
    res.status(201).set('Content-Type', 'application/json; charset=utf-8').end(JSON.stringify(body));
  });
  return r;
}
