import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
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
    /** Suspect section → likelihood ratio (the rule beside the contract's FAULT_CODE_WEIGHT). */
    weights: jsonb('weights').$type<Record<string, number>>().notNull().default({}),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('fault_codes_shop_idx').on(t.shopId, t.boardId)],
);

/** A known-good board's readings for a board model (one set = one board): recorded, or a repaired board's verification. */
export const referenceSets = pgTable(
  'reference_sets',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    boardId: text('board_id')
      .notNull()
      .references(() => boardModels.id),
    /** The version the readings were taken against (their points are that version's). */
    versionId: text('version_id')
      .notNull()
      .references(() => boardModelVersions.id),
    /** The repaired job whose verification readings were promoted; null for a recorded good board. */
    jobId: text('job_id'),
    serial: text('serial'),
    note: text('note'),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('reference_sets_board_idx').on(t.shopId, t.boardId), uniqueIndex('reference_sets_job_unique').on(t.jobId)],
);

export const referenceReadings = pgTable(
  'reference_readings',
  {
    id: text('id').primaryKey(),
    setId: text('set_id')
      .notNull()
      .references(() => referenceSets.id),
    mode: text('mode').notNull(),
    power: text('power').notNull(),
    /** Probe points as given (TP3, gnd) and the nets they resolve to on the set's version. */
    red: text('red').notNull(),
    black: text('black').notNull(),
    redNet: text('red_net').notNull(),
    blackNet: text('black_net').notNull(),
    /** Volts or ohms; null with overLimit for OL. */
    value: doublePrecision('value'),
    overLimit: boolean('over_limit').notNull().default(false),
  },
  (t) => [index('reference_readings_set_idx').on(t.setId)],
);
