// A shop of a browser spec's own: made by the factories the demo seed uses (one person per role, the demo boards
// published), and removed with everything it owns (remove-shop.ts). Only the test-only route calls this
// (routes.ts; docs/decisions/0009-test-shops.md).
import { and, eq, sql } from 'drizzle-orm';
import type { BoardModel, ExpectedReadingRow } from '@splitscope/contract';
import { INDOOR_FAN_BOARD, OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import type { Db } from '../db/client';
import { boardModelVersions, uploads } from '../db/schema';
import { DEMO_USERS } from '../db/seed';
import type { Storage } from '../storage/storage';
import { createBoardModel, createShop, createUser } from './factories';
import { removeShop } from './remove-shop';
import { DEMO_BOARD_IDS, TEST_SHOP_PASSWORD, type TestShop } from './requests';

/** Test shops' ids start with this: the route removes no other shop (never the demo's). */
export const TEST_SHOP_PREFIX = 'shop-test-';

const DEMO_DOCUMENTS: Record<keyof typeof DEMO_BOARD_IDS, BoardModel> = { outdoorFan: OUTDOOR_FAN_BOARD, indoorFan: INDOOR_FAN_BOARD };

/**
 * The expected table of a stored version with this very document (the demo shop's, seeded at start), copied
 * instead of computed again: computing it solves the board in every state (seconds), copying is one query.
 */
async function storedTable(db: Db, document: BoardModel): Promise<ExpectedReadingRow[] | undefined> {
  const [row] = await db
    .select({ table: boardModelVersions.expectedReadings })
    .from(boardModelVersions)
    .where(and(sql`${boardModelVersions.document} = ${JSON.stringify(document)}::jsonb`, sql`jsonb_array_length(${boardModelVersions.expectedReadings}) > 0`))
    .limit(1);
  return row?.table as ExpectedReadingRow[] | undefined;
}

export async function createTestShop(db: Db): Promise<TestShop> {
  const tag = crypto.randomUUID().slice(0, 8);
  const shop = await createShop(db, { id: `${TEST_SHOP_PREFIX}${tag}`, name: `Test Bench ${tag}` });
  const people = await Promise.all(
    (['admin', 'lead', 'tech', 'trainee'] as const).map((role) => {
      const demo = DEMO_USERS.find((u) => u.shopId === 'shop-demo' && u.role === role)!;
      return createUser(db, { shopId: shop.id, role, name: demo.name, email: `${role}-${tag}@test-shop.test`, password: TEST_SHOP_PASSWORD });
    }),
  );
  const users = Object.fromEntries(people.map((u) => [u.role, { id: u.id, email: u.email, name: u.name }])) as TestShop['users'];
  const boards = {} as TestShop['boards'];
  for (const [key, document] of Object.entries(DEMO_DOCUMENTS) as [keyof typeof DEMO_BOARD_IDS, BoardModel][]) {
    const id = `${shop.id}-${DEMO_BOARD_IDS[key]}`;
    await createBoardModel(db, { shopId: shop.id, createdBy: users.admin.id, id, document, expectedReadings: await storedTable(db, document) });
    boards[key] = id;
  }
  return { id: shop.id, name: shop.name, users, boards };
}

/** Removes a test shop, its rows and its uploads' stored bytes; returns the rows removed per table. */
export async function removeTestShop(db: Db, storage: Storage, shopId: string): Promise<Record<string, number>> {
  const stored = await db.select({ key: uploads.storageKey }).from(uploads).where(eq(uploads.shopId, shopId));
  const removed = await removeShop(db, shopId);
  await Promise.all(stored.map((u) => storage.delete(u.key)));
  return removed;
}
