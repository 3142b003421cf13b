import { index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { shops, users } from './auth';

/** A board in the shop's library; its content lives in numbered, immutable versions. */
export const boardModels = pgTable(
  'board_models',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    /** The document's own id (stable across versions), unique in a shop. */
    key: text('key').notNull(),
    name: text('name').notNull(),
    currentVersion: integer('current_version').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('board_models_shop_key_unique').on(t.shopId, t.key)],
);

export const boardModelVersions = pgTable(
  'board_model_versions',
  {
    id: text('id').primaryKey(),
    boardId: text('board_id')
      .notNull()
      .references(() => boardModels.id),
    version: integer('version').notNull(),
    document: jsonb('document').notNull(),
    /** Computed once when the version is stored: a version never changes, so neither does its table. */
    expectedReadings: jsonb('expected_readings').notNull(),
    note: text('note'),
    createdBy: text('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('board_model_versions_unique').on(t.boardId, t.version)],
);

/** The shop's fault-code table: what a unit's displayed code points at, per board model or shop-wide. */
export const faultCodes = pgTable(
  'fault_codes',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    boardId: text('board_id').references(() => boardModels.id),
    code: text('code').notNull(),
    title: text('title').notNull(),
    description: text('description'),
    sections: text('sections').array().notNull().default([]),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('fault_codes_shop_idx').on(t.shopId, t.boardId)],
);
