import { Router } from 'express';
import { boardHistoryResponse, idParams, serialQuery } from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { findBoardHistory, findJobHistory } from './service';

export function boardHistoryRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/board-history', requireRole(...ROLES.everyone), async (req, res) => {
    const q = parse(serialQuery, req.query);
    res.json(
      boardHistoryResponse.parse(
        await findBoardHistory({ db: ctx.db, shopId: actorOf(req).shopId, serial: q.serial || undefined, unitSerial: q.unitSerial || undefined }),
      ),
    );
  });
  r.get('/jobs/:id/history', requireRole(...ROLES.everyone), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(boardHistoryResponse.parse(await findJobHistory({ db: ctx.db, shopId: actorOf(req).shopId, jobId: id })));
  });
  return r;
}
