import { Router } from 'express';
import { boardReferencesResponse, createReferenceSetRequest, idParams, promoteReferenceRequest } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createReferenceSet, getBoardReferences, promoteVerification } from './service';

export function referenceRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/boards/:id/references', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(boardReferencesResponse.parse(await getBoardReferences({ db: ctx.db, shopId: actorOf(req).shopId, boardId: id })));
  });
  // A technician records a good board; a lead promotes a signed-off repair (the sign-off is theirs too).
  r.post('/boards/:id/references', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(createReferenceSetRequest, req.body);
    res.status(201).json(boardReferencesResponse.parse(await createReferenceSet({ db: ctx.db, actor: actorOf(req), boardId: id, input })));
  });
  r.post('/jobs/:id/reference', requireRole(...ROLES.reviewers), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { note } = parse(promoteReferenceRequest, req.body);
    res.status(201).json(boardReferencesResponse.parse(await promoteVerification({ db: ctx.db, actor: actorOf(req), jobId: id, note: note ?? null })));
  });
  return r;
}
