import { Router } from 'express';
import { firstRunRequest, setupStatusResponse, shopSchema, updateShopRequest } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { addressLimit } from '../../http/rate-limit';
import { getShop, runFirstRun, setupStatus, updateShop } from './service';

export function shopRoutes(ctx: AppContext): Router {
  const r = Router();
  const mode = ctx.config.SPLITSCOPE_MODE;
  r.get('/setup', async (_req, res) => {
    res.json(setupStatusResponse.parse(await setupStatus({ db: ctx.db, mode })));
  });
  const limit = addressLimit(20);
  r.post('/setup', limit, async (req, res) => {
    const input = parse(firstRunRequest, req.body);
    const { cookie } = await runFirstRun({ db: ctx.db, auth: ctx.auth, mode, input });
    res.append('Set-Cookie', cookie).status(204).end();
  });
  r.get('/shop', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(shopSchema.parse(await getShop({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  r.patch('/shop', requireRole(...ROLES.admins), async (req, res) => {
    const input = parse(updateShopRequest, req.body);
    res.json(shopSchema.parse(await updateShop({ db: ctx.db, storage: ctx.storage, actor: actorOf(req), input })));
  });
  return r;
}
