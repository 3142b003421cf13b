// Test-only routes: a browser spec asks the server for a shop of its own and removes it afterwards. They exist only
// on a demo server with the local fakes (`npm start`, the browser-test run, the integration tests): never in shop
// mode and never against the hosted mail and payment services (docs/decisions/0009-test-shops.md).
import { Router } from 'express';
import type { Config } from '../config';
import type { AppContext } from '../context';
import { AppError } from '../http/errors';
import { localFakesOn } from '../features/mail';
import { shopRowCounts } from './remove-shop';
import { createTestShop, removeTestShop, TEST_SHOP_PREFIX } from './test-shops';

export const testShopsOn = (config: Config): boolean => config.SPLITSCOPE_MODE === 'demo' && localFakesOn(config);

export function testShopRoutes(ctx: AppContext): Router {
  const r = Router();
  const testShopId = (id: string) => {
    if (!id.startsWith(TEST_SHOP_PREFIX)) throw new AppError('not_found', `No test shop ${id}`);
    return id;
  };
  r.post('/testing/shops', async (_req, res) => {
    res.status(201).json(await createTestShop(ctx.db));
  });
  r.get('/testing/shops/:id/rows', async (req, res) => {
    res.json(await shopRowCounts(ctx.db, testShopId(req.params.id)));
  });
  r.delete('/testing/shops/:id', async (req, res) => {
    res.json(await removeTestShop(ctx.db, ctx.storage, testShopId(req.params.id)));
  });
  return r;
}
