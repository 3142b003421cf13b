import { eq } from 'drizzle-orm';
import { DEFAULT_DUTY_RULES, type DutyRules, type UpdateDutyRulesRequest } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { shopRules } from '../../db/schema';

/** The shop's separation-of-duties rules; the defaults until an admin changes them. */
export async function getDutyRules(db: Db, shopId: string): Promise<DutyRules> {
  const [row] = await db.select().from(shopRules).where(eq(shopRules.shopId, shopId));
  return row ? { selfApproval: row.selfApproval, correctOthersMinRole: row.correctOthersMinRole } : { ...DEFAULT_DUTY_RULES };
}

export async function updateDutyRules({ db, shopId, input }: { db: Db; shopId: string; input: UpdateDutyRulesRequest }): Promise<DutyRules> {
  const next = { ...(await getDutyRules(db, shopId)), ...input };
  await db
    .insert(shopRules)
    .values({ shopId, ...next })
    .onConflictDoUpdate({ target: shopRules.shopId, set: { ...next, updatedAt: new Date() } });
  return next;
}
