import { Router } from 'express';
import { sql } from 'drizzle-orm';
import type { Health } from '@splitscope/contract';
import type { AppContext } from '../../context';

export function healthRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/health', async (_req, res) => {
    let db: Health['db'] = 'ok';
    try {
      await ctx.db.execute(sql`select 1`);
    } catch {
      db = 'down';
    }
    const body: Health = { status: db === 'ok' ? 'ok' : 'degraded', db };
    res.status(db === 'ok' ? 200 : 503).json(body);
  });
  return r;
}
