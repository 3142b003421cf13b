import { Router } from 'express';
import { binPartInput, binPartListResponse, binPartSchema, idParams, quoteDraftResponse, updateBinPartRequest } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createBinPart, findBinParts, quoteDraft, updateBinPart } from './service';

export function partsBinRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/parts-bin', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(binPartListResponse.parse(await findBinParts({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  // The reorder list: drawers under their minimum.
  r.get('/parts-bin/reorder', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(binPartListResponse.parse(await findBinParts({ db: ctx.db, shopId: actorOf(req).shopId, reorderOnly: true })));
  });
  // Whoever repairs stocks the drawers: technicians, leads, admins.
  r.post('/parts-bin', requireRole(...ROLES.bench), async (req, res) => {
    const input = parse(binPartInput, req.body);
    res.status(201).json(binPartSchema.parse(await createBinPart({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  r.patch('/parts-bin/:id', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const input = parse(updateBinPartRequest, req.body);
    res.json(binPartSchema.parse(await updateBinPart({ db: ctx.db, shopId: actorOf(req).shopId, id, input })));
  });
  r.get('/jobs/:id/quote-draft', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(quoteDraftResponse.parse(await quoteDraft({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  return r;
}
