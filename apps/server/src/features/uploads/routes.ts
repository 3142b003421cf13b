import express, { Router } from 'express';
import { idParams, uploadListResponse, uploadQuery, uploadRefusalListResponse, uploadSchema } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { createUpload, findUploadRefusals, findUploads, getUploadBytes } from './service';

export function uploadRoutes(ctx: AppContext): Router {
  const r = Router();
  // Raw bytes of any declared type: the service decides from the bytes themselves.
  const raw = express.raw({ type: () => true, limit: ctx.config.UPLOAD_MAX_BYTES });
  r.post('/uploads', requireRole(...ROLES.everyone), raw, async (req, res) => {
    const { jobId, name } = parse(uploadQuery, req.query);
    const bytes = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    res.status(201).json(uploadSchema.parse(await createUpload({ db: ctx.db, storage: ctx.storage, actor: actorOf(req), bytes, jobId, name })));
  });
  r.get('/uploads/:id', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { contentType, bytes } = await getUploadBytes({ db: ctx.db, storage: ctx.storage, shopId: actorOf(req).shopId, id });
    // Kept by the browser but checked with the server (ETag) on every use, so a signed-out browser gets a 401.
    res.setHeader('Cache-Control', 'private, no-cache');
    res.setHeader('Content-Disposition', 'inline');
    res.type(contentType).send(bytes);
  });
  r.get('/jobs/:id/upload-refusals', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(uploadRefusalListResponse.parse(await findUploadRefusals({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  r.get('/jobs/:id/uploads', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(uploadListResponse.parse(await findUploads({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  return r;
}
