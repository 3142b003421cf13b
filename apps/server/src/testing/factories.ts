// Factories shared by the demo seed and the tests: one way to make a shop or a user.
import type { Role } from '@splitscope/contract';
import { hashPassword } from '../auth/password';
import type { Db } from '../db/client';
import { shops, users } from '../db/schema';
import { newId } from '../lib/ids';

export async function createShop(db: Db, overrides: Partial<typeof shops.$inferInsert> = {}) {
  const row = { id: newId(), name: 'Test Bench Shop', ...overrides };
  await db.insert(shops).values(row).onConflictDoNothing();
  return row;
}

export async function createUser(
  db: Db,
  overrides: { shopId: string; email?: string; name?: string; role?: Role; password?: string; id?: string },
) {
  const row = {
    id: overrides.id ?? newId(),
    shopId: overrides.shopId,
    email: overrides.email ?? `user-${newId()}@example.test`,
    name: overrides.name ?? 'Test User',
    role: overrides.role ?? ('tech' as Role),
    passwordHash: await hashPassword(overrides.password ?? 'test-password'),
  };
  await db.insert(users).values(row).onConflictDoNothing();
  return row;
}
