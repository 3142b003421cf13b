import { Router } from 'express';
import {
  createReadingRequest,
  idParams,
  readingListQuery,
  readingListResponse,
  readingParams,
  readingSchema,
  strikeReadingRequest,
  type CreateReadingResponse,
} from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createReading, findReadings, strikeReading } from './service';

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
    // The answer is built field by field from the stored row and typed by the contract, so it is not parsed
    // again; and it is written out directly: `res.json` would also hash it for an ETag no client of a POST uses.
    // Both were measurable parts of the busiest request (`npm run bench:api`).
    const body: CreateReadingResponse = await createReading({ db: ctx.db, actor: actorOf(req), jobId: id, input });
    res.status(201).set('Content-Type', 'application/json; charset=utf-8').end(JSON.stringify(body));
  });
  r.post('/jobs/:id/readings/:readingId/strike', requireRole(...ROLES.everyone), async (req, res) => {
    const { id, readingId } = parse(readingParams, req.params);
    const { reason } = parse(strikeReadingRequest, req.body);
    res.status(201).json(readingSchema.parse(await strikeReading({ db: ctx.db, actor: actorOf(req), jobId: id, readingId, reason })));
  });
  return r;
}
