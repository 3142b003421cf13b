import { Router } from 'express';
import { idParams, meterImportRequest, meterImportResponse, meterProfileInput, meterProfileListResponse, meterProfileSchema } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { findMeterProfiles, importReadings, previewImport, saveMeterProfile } from './service';

export function meterImportRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/meter-profiles', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(meterProfileListResponse.parse(await findMeterProfiles({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  r.put('/meter-profiles', requireRole(...ROLES.bench), async (req, res) => {
    const input = parse(meterProfileInput, req.body);
    res.json(meterProfileSchema.parse(await saveMeterProfile({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  // The preview stores nothing: the same body, answered row by row.
  r.post('/jobs/:id/meter-import/preview', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const body = parse(meterImportRequest, req.body);
    res.json(meterImportResponse.parse(await previewImport({ db: ctx.db, actor: actorOf(req), jobId: id, body })));
  });
  r.post('/jobs/:id/meter-import', requireRole(...ROLES.bench), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const body = parse(meterImportRequest, req.body);
    res.json(meterImportResponse.parse(await importReadings({ db: ctx.db, actor: actorOf(req), jobId: id, body })));
  });
  return r;
}
