import { Router } from 'express';
import { createReviewRequest, idParams, reviewListResponse, reviewSchema } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createReview, findReviews } from './service';

export function reviewRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/jobs/:id/reviews', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(reviewListResponse.parse(await findReviews({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  r.post('/jobs/:id/reviews', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(createReviewRequest, req.body);
    res.status(201).json(reviewSchema.parse(await createReview({ db: ctx.db, actor: actorOf(req), jobId: id, input })));
  });
  return r;
}
