import { Router } from 'express';
import {
  boardDetailSchema,
  CAPTURE_ROLES,
  boardDraftSchema,
  createUnlistedBoardRequest,
  idParams,
  publishDraftRequest,
  saveDraftRequest,
} from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createUnlistedBoard, getDraft, publishDraft, saveDraft } from './service';

export function captureRoutes(ctx: AppContext): Router {
  const r = Router();
  // Whoever opens jobs takes in a board the library does not hold yet.
  r.post('/boards/unlisted', requireRole(...CAPTURE_ROLES.intake), async (req, res) => {
    const input = parse(createUnlistedBoardRequest, req.body);
    res.status(201).json(boardDetailSchema.parse(await createUnlistedBoard({ db: ctx.db, actor: actorOf(req), input })));
  });
  r.get('/boards/:id/draft', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(boardDraftSchema.parse(await getDraft({ db: ctx.db, shopId: actorOf(req).shopId, boardId: id })));
  });
  // The bench marks boards; publishing a model is a lead's, as editing one is.
  r.put('/boards/:id/draft', requireRole(...CAPTURE_ROLES.mark), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { capture } = parse(saveDraftRequest, req.body);
    res.json(boardDraftSchema.parse(await saveDraft({ db: ctx.db, actor: actorOf(req), boardId: id, capture })));
  });
  r.post('/boards/:id/publish', requireRole(...CAPTURE_ROLES.publish), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { note } = parse(publishDraftRequest, req.body ?? {});
    res.status(201).json(boardDetailSchema.parse(await publishDraft({ db: ctx.db, actor: actorOf(req), boardId: id, note })));
  });
  return r;
}
