// Factories shared by the demo seed and the tests: one way to make a shop or a user.
import { eq } from 'drizzle-orm';
import type { BoardModel, CreateJobRequest, ExpectedReadingRow, Role } from '@splitscope/contract';
import { hashPassword } from '../auth/password';
import type { Db } from '../db/client';
import { boardModels, customers, jobs, shops, users } from '../db/schema';
import { createBoard } from '../features/boards/service';
import { createJob as createJobService } from '../features/jobs/service';
import { newId } from '../lib/ids';
import { DIVIDER_BOARD } from './boards';
import { CUSTOMER_DEFAULTS, JOB_DEFAULTS } from './requests';

export { DIVIDER_BOARD };

export async function createShop(db: Db, overrides: Partial<typeof shops.$inferInsert> = {}) {
  const row = { id: newId(), name: 'Test Bench Shop', ...overrides };
  await db.insert(shops).values(row).onConflictDoNothing();
  return row;
}

export async function createUser(db: Db, overrides: { shopId: string; email?: string; name?: string; role?: Role; password?: string; id?: string }) {
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

export async function createCustomer(db: Db, overrides: Partial<typeof customers.$inferInsert> & { shopId: string }) {
  const row = { id: newId(), ...CUSTOMER_DEFAULTS, ...overrides };
  await db.insert(customers).values(row).onConflictDoNothing();
  return row;
}

/** A board model at version 1 (skipped when the id is already there). */
export async function createBoardModel(
  db: Db,
  o: { shopId: string; createdBy: string; id?: string; document?: BoardModel; expectedReadings?: ExpectedReadingRow[] },
) {
  const id = o.id ?? newId();
  const [exists] = await db.select({ id: boardModels.id }).from(boardModels).where(eq(boardModels.id, id));
  if (exists) return { id };
  const document = o.document ?? { ...DIVIDER_BOARD, id: `test-divider-${id}` };
  await createBoard({ db, actor: { id: o.createdBy, shopId: o.shopId }, document, id, expectedReadings: o.expectedReadings });
  return { id };
}

export async function createJob(
  db: Db,
  o: { shopId: string; createdBy: string; customerId: string; boardId: string } & Partial<CreateJobRequest> & { id?: string },
) {
  if (o.id) {
    const [exists] = await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.id, o.id));
    if (exists) return { id: o.id };
  }
  const job = await createJobService({
    db,
    actor: { id: o.createdBy, shopId: o.shopId },
    input: { ...JOB_DEFAULTS, ...o },
  });
  return { id: job.id };
}
