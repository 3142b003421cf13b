import { boolean, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { roleEnum, shops } from './auth';

/**
 * A shop's separation-of-duties settings (one row per shop, created with the defaults on first use): whether
 * the person who proposed a diagnosis may also approve it, and the lowest role that may correct a reading
 * someone else took. The rules themselves live in the contract (`duties.ts`).
 */
export const shopRules = pgTable('shop_rules', {
  shopId: text('shop_id')
    .primaryKey()
    .references(() => shops.id),
  selfApproval: boolean('self_approval').notNull().default(false),
  correctOthersMinRole: roleEnum('correct_others_min_role').notNull().default('lead'),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});
