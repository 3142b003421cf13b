import { bigserial, customType, index, integer, jsonb, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { boardModelVersions } from './boards';

/** float64 little-endian predictions (docs/decisions/0005-fault-dictionary-storage.md). */
const float64s = customType<{ data: Uint8Array; driverData: Buffer }>({
  dataType: () => 'bytea',
  toDriver: (v) => Buffer.from(v.buffer, v.byteOffset, v.byteLength),
  fromDriver: (v) => new Uint8Array(v.buffer, v.byteOffset, v.byteLength),
});

/**
 * A board version's fault dictionary (the diagnosis package's dictionary.ts): its state while a process builds it,
 * the tests (rows) and fault columns it holds. Keyed by the engine that computed it: a newer engine builds its own.
 */
export const faultDictionaries = pgTable(
  'fault_dictionaries',
  {
    versionId: text('version_id')
      .notNull()
      .references(() => boardModelVersions.id),
    engineVersion: text('engine_version').notNull(),
    state: text('state', { enum: ['building', 'ready', 'failed'] }).notNull(),
    partsDone: integer('parts_done').notNull().default(0),
    partsTotal: integer('parts_total').notNull().default(0),
    /** Column keys: the healthy board then every single sub-fault. Empty until ready. */
    faults: jsonb('faults').notNull().default([]),
    error: text('error'),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.versionId, t.engineVersion] })],
);

/** One row per board version × test: the test and its predictions, aligned with the dictionary's fault columns. */
export const faultDictionaryRows = pgTable(
  'fault_dictionary_rows',
  {
    versionId: text('version_id').notNull(),
    engineVersion: text('engine_version').notNull(),
    position: integer('position').notNull(),
    test: jsonb('test').notNull(),
    predictions: float64s('predictions').notNull(),
  },
  (t) => [primaryKey({ columns: [t.versionId, t.engineVersion, t.position] })],
);

/** Fault pairs computed in the background since: one fault set's predictions on the tests named beside them. */
export const faultDictionaryPairs = pgTable(
  'fault_dictionary_pairs',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    versionId: text('version_id').notNull(),
    engineVersion: text('engine_version').notNull(),
    faultKey: text('fault_key').notNull(),
    testKeys: jsonb('test_keys').notNull(),
    predictions: float64s('predictions').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('fault_dictionary_pairs_version').on(t.versionId, t.engineVersion)],
);
