import { Router } from 'express';
import { dutyRulesSchema, updateDutyRulesRequest } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { getDutyRules, updateDutyRules } from './service';

/** The shop's separation-of-duties settings: everyone reads them (screens say why a button is off), admins set them. */
export function dutyRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/shop/duties', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(dutyRulesSchema.parse(await getDutyRules(ctx.db, actorOf(req).shopId)));
  });
  r.patch('/shop/duties', requireRole(...ROLES.admins), async (req, res) => {
    const input = parse(updateDutyRulesRequest, req.body);
    res.json(dutyRulesSchema.parse(await updateDutyRules({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  return r;
}
