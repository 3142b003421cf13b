import { bigint, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { shops, users } from './auth';
import { jobs, meterModeEnum, powerStateEnum, repairActions } from './jobs';

/**
 * A shop's service terms (one row per shop, made with the defaults on first use): how many days after a board
 * left the shop its return counts as a warranty return, and the labour rate quotes are pre-filled with.
 */
export const serviceTerms = pgTable('service_terms', {
  shopId: text('shop_id')
    .primaryKey()
    .references(() => shops.id),
  warrantyDays: integer('warranty_days').notNull().default(90),
  /** Labour per hour, integer cents in the shop's billing currency. */
  labourRateCents: bigint('labour_rate_cents', { mode: 'number' }).notNull().default(0),
  /** Bench time a repair line is quoted with, in minutes. */
  repairMinutes: integer('repair_minutes').notNull().default(60),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** One drawer's stock of one replacement part. Quantity never goes below zero (a check in the migration). */
export const binParts = pgTable(
  'bin_parts',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    /** The value as written on the drawer ("4k7", "100uF"); `nominal` is it parsed to SI units. */
    value: text('value').notNull(),
    nominal: doublePrecision('nominal'),
    package: text('package').notNull(),
    /** Voltage / power rating as written ("50 V", "0.25 W"). */
    rating: text('rating'),
    marking: text('marking'),
    quantity: integer('quantity').notNull(),
    drawer: text('drawer').notNull(),
    minimum: integer('minimum').notNull().default(0),
    /** What one part costs the customer, integer cents. */
    unitCents: bigint('unit_cents', { mode: 'number' }).notNull().default(0),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('bin_parts_shop_idx').on(t.shopId, t.drawer)],
);

/** A part taken from the bin for a repair: the stock's history and what the quote is pre-filled from. */
export const binTakes = pgTable(
  'bin_takes',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    binPartId: text('bin_part_id')
      .notNull()
      .references(() => binParts.id),
    jobId: text('job_id')
      .notNull()
      .references(() => jobs.id),
    repairId: text('repair_id')
      .notNull()
      .references(() => repairActions.id),
    quantity: integer('quantity').notNull(),
    takenBy: text('taken_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('bin_takes_job_idx').on(t.jobId), index('bin_takes_part_idx').on(t.binPartId)],
);

/**
 * How one meter's logged CSV maps onto readings: which column holds the test point, the value, its unit, the meter
 * function and the time; what to assume where the log has no such column. Saved per meter, by name.
 */
export const meterProfiles = pgTable(
  'meter_profiles',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    name: text('name').notNull(),
    /** Column names: { point, value, unit?, function?, reference?, time? } (contract: meterColumnMapping). */
    mapping: jsonb('mapping').notNull(),
    defaultMode: meterModeEnum('default_mode').notNull().default('dcv'),
    defaultReference: text('default_reference').notNull().default('gnd'),
    power: powerStateEnum('power').notNull().default('on'),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('meter_profiles_shop_name_unique').on(t.shopId, t.name)],
);
