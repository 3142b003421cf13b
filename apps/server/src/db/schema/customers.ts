import { index, pgEnum, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { shops } from './auth';

export const customerKindEnum = pgEnum('customer_kind', ['contractor', 'field-technician']);

export const customers = pgTable(
  'customers',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    name: text('name').notNull(),
    company: text('company'),
    email: text('email'),
    phone: text('phone'),
    kind: customerKindEnum('kind').notNull(),
    notes: text('notes'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('customers_shop_idx').on(t.shopId, t.name)],
);
