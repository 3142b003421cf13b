import { eq } from 'drizzle-orm';
import type { ServiceTerms, UpdateServiceTermsRequest } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { serviceTerms } from '../../db/schema';

/** The shop's warranty days and labour rate; a shop that never set them has the defaults of the table. */
export async function getServiceTerms(db: Db, shopId: string): Promise<ServiceTerms> {
  const [row] = await db.select().from(serviceTerms).where(eq(serviceTerms.shopId, shopId));
  if (row) return { warrantyDays: row.warrantyDays, labourRateCents: row.labourRateCents, repairMinutes: row.repairMinutes };
  await db.insert(serviceTerms).values({ shopId }).onConflictDoNothing();
  return getServiceTerms(db, shopId);
}

export async function updateServiceTerms({ db, shopId, input }: { db: Db; shopId: string; input: UpdateServiceTermsRequest }): Promise<ServiceTerms> {
  await getServiceTerms(db, shopId);
  await db
    .update(serviceTerms)
    .set({ ...input, updatedAt: new Date() })
    .where(eq(serviceTerms.shopId, shopId));
  return getServiceTerms(db, shopId);
}
