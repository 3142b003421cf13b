import { and, asc, eq, ilike, or, type SQL } from 'drizzle-orm';
import type { CreateCustomerRequest, Customer, CustomerListQuery, UpdateCustomerRequest } from '@splitscope/contract';
import type { Db } from '../../db/client';
import type { Actor } from '../../auth/guards';
import { auditLog, customers, invoices, jobs, quotes } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';

type Row = typeof customers.$inferSelect;

export const toCustomer = (r: Row): Customer => ({
  id: r.id,
  shopId: r.shopId,
  name: r.name,
  company: r.company,
  email: r.email,
  phone: r.phone,
  kind: r.kind,
  notes: r.notes,
  createdAt: iso(r.createdAt),
});

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function findCustomers({ db, shopId, query }: { db: Db; shopId: string; query: CustomerListQuery }) {
  const where: SQL[] = [eq(customers.shopId, shopId)];
  if (query.kind) where.push(eq(customers.kind, query.kind));
  if (query.q) {
    const like = `%${escapeLike(query.q)}%`;
    where.push(or(ilike(customers.name, like), ilike(customers.company, like), ilike(customers.email, like))!);
  }
  const rows = await db
    .select()
    .from(customers)
    .where(and(...where))
    .orderBy(asc(customers.name));
  return { items: rows.map(toCustomer) };
}

export async function getCustomer({ db, shopId, id }: { db: Db; shopId: string; id: string }): Promise<Customer> {
  const [row] = await db
    .select()
    .from(customers)
    .where(and(eq(customers.id, id), eq(customers.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No customer ${id}`);
  return toCustomer(row);
}

export async function createCustomer({ db, shopId, input }: { db: Db; shopId: string; input: CreateCustomerRequest }) {
  const [row] = await db
    .insert(customers)
    .values({
      id: newId(),
      shopId,
      name: input.name,
      company: input.company ?? null,
      email: input.email ?? null,
      phone: input.phone ?? null,
      kind: input.kind,
      notes: input.notes ?? null,
    })
    .returning();
  return toCustomer(row!);
}

export async function updateCustomer({ db, shopId, id, input }: { db: Db; shopId: string; id: string; input: UpdateCustomerRequest }) {
  const [row] = await db
    .update(customers)
    .set(input)
    .where(and(eq(customers.id, id), eq(customers.shopId, shopId)))
    .returning();
  if (!row) throw new AppError('not_found', `No customer ${id}`);
  return toCustomer(row);
}

/**
 * Two rows for one customer (typed twice at the counter): the duplicate's jobs, quotes and invoices move to the
 * kept row, the kept row's empty fields take the duplicate's values, and the duplicate is deleted. One transaction.
 */
export async function mergeCustomers({ db, actor, keepId, duplicateId }: { db: Db; actor: Actor; keepId: string; duplicateId: string }) {
  return db.transaction(async (tx) => {
    const rows = await tx
      .select()
      .from(customers)
      .where(and(eq(customers.shopId, actor.shopId), or(eq(customers.id, keepId), eq(customers.id, duplicateId))))
      .orderBy(asc(customers.id))
      .for('update');
    const keep = rows.find((r) => r.id === keepId);
    const dup = rows.find((r) => r.id === duplicateId);
    if (!keep) throw new AppError('not_found', `No customer ${keepId}`);
    if (keepId === duplicateId)
      throw new AppError('invalid', 'Choose another customer to merge into this one', { errors: [{ path: 'duplicateId', message: 'the same customer' }] });
    if (!dup) throw new AppError('not_found', `No customer ${duplicateId}`);
    const moved = {
      jobs: (await tx.update(jobs).set({ customerId: keepId }).where(eq(jobs.customerId, duplicateId)).returning({ id: jobs.id })).length,
      quotes: (await tx.update(quotes).set({ customerId: keepId }).where(eq(quotes.customerId, duplicateId)).returning({ id: quotes.id })).length,
      invoices: (await tx.update(invoices).set({ customerId: keepId }).where(eq(invoices.customerId, duplicateId)).returning({ id: invoices.id })).length,
    };
    const notes = [keep.notes, dup.notes].filter(Boolean).join('\n');
    const [row] = await tx
      .update(customers)
      .set({ company: keep.company ?? dup.company, email: keep.email ?? dup.email, phone: keep.phone ?? dup.phone, notes: notes || null })
      .where(eq(customers.id, keepId))
      .returning();
    await tx.delete(customers).where(eq(customers.id, duplicateId));
    await tx.insert(auditLog).values({
      id: newId(),
      shopId: actor.shopId,
      userId: actor.id,
      action: 'customer-merge',
      subject: keepId,
      detail: `${dup.name} (${duplicateId}) merged into ${keep.name}: ${moved.jobs} jobs, ${moved.quotes} quotes, ${moved.invoices} invoices`,
    });
    return { customer: toCustomer(row!), moved };
  });
}
