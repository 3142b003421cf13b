import { sql } from 'drizzle-orm';
import { boolean, doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { authorColumns, shops, users } from './auth';
import { boardModels, boardModelVersions } from './boards';
import { customers } from './customers';

export const jobStatusEnum = pgEnum('job_status', ['received', 'diagnosing', 'awaiting-review', 'approved', 'repaired', 'verified', 'returned']);
export const priorityEnum = pgEnum('job_priority', ['low', 'normal', 'high']);
export const meterModeEnum = pgEnum('meter_mode', ['dcv', 'ohm', 'diode', 'continuity']);
export const powerStateEnum = pgEnum('power_state', ['on', 'off']);
export const readingPhaseEnum = pgEnum('reading_phase', ['diagnosis', 'verification']);
export const reviewDecisionEnum = pgEnum('review_decision', ['approve', 'send-back']);
export const repairActionEnum = pgEnum('repair_action', ['replaced', 'removed', 'reflowed', 'cleaned']);

export const jobs = pgTable(
  'jobs',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    number: integer('number').notNull(),
    customerId: text('customer_id')
      .notNull()
      .references(() => customers.id),
    unitDescription: text('unit_description').notNull(),
    serial: text('serial'),
    /** The serial of the air-conditioning unit the board came out of (the board's own serial is `serial`). */
    unitSerial: text('unit_serial'),
    boardId: text('board_id')
      .notNull()
      .references(() => boardModels.id),
    /** The board model version the job is diagnosed on; later edits to the board do not move it. */
    boardVersionId: text('board_version_id')
      .notNull()
      .references(() => boardModelVersions.id),
    faultCode: text('fault_code'),
    symptom: text('symptom').notNull(),
    status: jobStatusEnum('status').notNull().default('received'),
    sentBack: boolean('sent_back').notNull().default(false),
    proposedPart: text('proposed_part'),
    assigneeId: text('assignee_id').references(() => users.id),
    priority: priorityEnum('priority').notNull().default('normal'),
    receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
    dueAt: timestamp('due_at', { withTimezone: true }),
    closedAt: timestamp('closed_at', { withTimezone: true }),
    /** How a returned board left the shop ('courier', 'collected'); set with `closedAt`. */
    returnedVia: text('returned_via'),
    /** The technician's note with the proposed part, for the lead who reviews it. */
    proposalNote: text('proposal_note'),
    /** The lead who let the assigned trainee leave guided order on this job; null while guided order binds. */
    guidedLiftedBy: text('guided_lifted_by').references(() => users.id),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id),
    /** The intake request's key, so a repeated create answers the job it made. */
    idempotencyKey: text('idempotency_key'),
    /** The meter profile the job's readings are taken with (a shipped profile id); null = the shop's default. */
    meterProfile: text('meter_profile'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('jobs_shop_number_unique').on(t.shopId, t.number),
    // One job per intake request: a repeated create (double click, retry after a lost answer) finds this row.
    uniqueIndex('jobs_shop_idempotency_unique')
      .on(t.shopId, t.idempotencyKey)
      .where(sql`${t.idempotencyKey} is not null`),
    index('jobs_shop_status_idx').on(t.shopId, t.status),
    index('jobs_assignee_idx').on(t.assigneeId),
    // A board that comes back is found by its serial, as typed at intake in any case.
    index('jobs_shop_serial_idx').on(t.shopId, sql`lower(${t.serial})`),
    index('jobs_shop_unit_serial_idx').on(t.shopId, sql`lower(${t.unitSerial})`),
  ],
);

/**
 * The first columns of every row of a job's history (readings, reviews, repairs, quotes, links, …): its id, the
 * shop it belongs to and the job. A function, so each table gets column builders of its own.
 */
/** The person who wrote a row of a job's history and when (older tables name the column author_id). */
const writtenBy = () => ({
  authorId: text('author_id')
    .notNull()
    .references(() => users.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const jobRowColumns = () => ({
  id: text('id').primaryKey(),
  shopId: text('shop_id')
    .notNull()
    .references(() => shops.id),
  jobId: text('job_id')
    .notNull()
    .references(() => jobs.id),
});

/**
 * Append-only: a correction is a new row whose `supersedes` names the corrected one; nothing is updated.
 * The verdict is computed against the job's pinned board version when the row is stored.
 */
export const readings = pgTable(
  'readings',
  {
    ...jobRowColumns(),
    idempotencyKey: text('idempotency_key').notNull(),
    /** sha256 of the request as parsed: a retry with the same key must send the same reading (null on older rows) */
    requestHash: text('request_hash'),
    mode: meterModeEnum('mode').notNull(),
    red: text('red').notNull(),
    black: text('black').notNull(),
    redNet: text('red_net').notNull(),
    blackNet: text('black_net').notNull(),
    power: powerStateEnum('power').notNull(),
    lifted: text('lifted').array().notNull().default([]),
    /** A lifted part measured on its own pins (its netlist name); null for a reading on the board. */
    alone: text('alone'),
    /** SI units (V or ohm); null when the meter showed OL. */
    value: doublePrecision('value'),
    overLimit: boolean('over_limit').notNull().default(false),
    unit: text('unit').notNull(),
    beep: boolean('beep'),
    raw: text('raw').notNull(),
    instrument: text('instrument'),
    phase: readingPhaseEnum('phase').notNull().default('diagnosis'),
    supersedes: text('supersedes'),
    verdict: jsonb('verdict'),
    /** The bus voltage the technician measured at the safety gate before this unpowered reading, if one was asked. */
    safetyBusVolts: doublePrecision('safety_bus_volts'),
    authorId: text('author_id')
      .notNull()
      .references(() => users.id),
    takenAt: timestamp('taken_at', { withTimezone: true }).notNull().defaultNow(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('readings_job_key_unique').on(t.jobId, t.idempotencyKey),
    // A reading is corrected at most once; a second correction corrects the correction.
    uniqueIndex('readings_supersedes_unique')
      .on(t.supersedes)
      .where(sql`${t.supersedes} is not null`),
    index('readings_job_idx').on(t.jobId, t.createdAt),
  ],
);

/**
 * A reading struck out, with the reason: the reading stays stored and listed (struck through), and the diagnosis
 * and the sign-off no longer count it. Append-only like the readings: a strike is never undone by an update.
 */
export const readingStrikes = pgTable(
  'reading_strikes',
  {
    ...jobRowColumns(),
    readingId: text('reading_id')
      .notNull()
      .references(() => readings.id),
    reason: text('reason').notNull(),
    ...writtenBy(),
  },
  (t) => [uniqueIndex('reading_strikes_reading_unique').on(t.readingId), index('reading_strikes_job_idx').on(t.jobId)],
);

export const diagnosisSnapshots = pgTable(
  'diagnosis_snapshots',
  {
    ...jobRowColumns(),
    engineVersion: text('engine_version').notNull(),
    proposedPart: text('proposed_part'),
    output: jsonb('output').notNull(),
    ...authorColumns(),
  },
  (t) => [index('diagnosis_snapshots_job_idx').on(t.jobId, t.createdAt)],
);

export const reviews = pgTable(
  'reviews',
  {
    ...jobRowColumns(),
    reviewerId: text('reviewer_id')
      .notNull()
      .references(() => users.id),
    decision: reviewDecisionEnum('decision').notNull(),
    comment: text('comment').notNull().default(''),
    proposedPart: text('proposed_part'),
    snapshotId: text('snapshot_id').references(() => diagnosisSnapshots.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('reviews_job_idx').on(t.jobId, t.createdAt)],
);

export const repairActions = pgTable(
  'repair_actions',
  {
    ...jobRowColumns(),
    part: text('part').notNull(),
    action: repairActionEnum('action').notNull(),
    replacementValue: text('replacement_value'),
    marking: text('marking'),
    notes: text('notes'),
    uploadIds: text('upload_ids').array().notNull().default([]),
    ...writtenBy(),
  },
  (t) => [index('repair_actions_job_idx').on(t.jobId, t.createdAt)],
);

export const uploads = pgTable(
  'uploads',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    jobId: text('job_id').references(() => jobs.id),
    contentType: text('content_type').notNull(),
    size: integer('size').notNull(),
    /** Pixel size of the stored picture (null for rows stored before pictures were measured). */
    width: integer('width'),
    height: integer('height'),
    /** Bytes as sent, when the stored picture was resized from them. */
    originalSize: integer('original_size'),
    sha256: text('sha256').notNull(),
    name: text('name'),
    /** The key under which the Storage keeps the bytes. */
    storageKey: text('storage_key').notNull(),
    ...authorColumns(),
  },
  (t) => [index('uploads_shop_idx').on(t.shopId, t.jobId)],
);

/** A picture sent for a job and not stored (refused type, damaged file): kept so the job shows it, not the form. */
export const uploadRefusals = pgTable(
  'upload_refusals',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    jobId: text('job_id')
      .notNull()
      .references(() => jobs.id),
    name: text('name'),
    size: integer('size').notNull(),
    reason: text('reason').notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('upload_refusals_job_idx').on(t.jobId, t.createdAt)],
);
