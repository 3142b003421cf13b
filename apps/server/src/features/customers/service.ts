import { and, asc, eq, ilike, or, type SQL } from 'drizzle-orm';
import type { CreateCustomerRequest, Customer, CustomerListQuery, UpdateCustomerRequest } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { customers } from '../../db/schema';
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
  const rows = await db.select().from(customers).where(and(...where)).orderBy(asc(customers.name));
  return { items: rows.map(toCustomer) };
}

export async function getCustomer({ db, shopId, id }: { db: Db; shopId: string; id: string }): Promise<Customer> {
  const [row] = await db.select().from(customers).where(and(eq(customers.id, id), eq(customers.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No customer ${id}`);
  return toCustomer(row);
}

export async function createCustomer({ db, shopId, input }: { db: Db; shopId: string; input: CreateCustomerRequest }) {
  const [row] = await db
    .insert(customers)
    .values({ id: newId(), shopId, name: input.name, company: input.company ?? null, email: input.email ?? null, phone: input.phone ?? null, kind: input.kind, notes: input.notes ?? null })
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
