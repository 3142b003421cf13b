import { z } from 'zod';
import { boardDetailSchema } from './boards';
import { counterSchema } from './bounds';
import { idSchema, isoDateTime, isoDateTimeInput, optionalText } from './common';
import { customerSchema } from './customers';
import { diagnosisSnapshotSchema } from './diagnosis';
import { jobMeterSchema, meterProfileIdSchema } from './meter-profiles';
import { returnMethods } from './policy-bench';
import { reviewSchema } from './reviews';

export const jobStatuses = ['received', 'diagnosing', 'awaiting-review', 'approved', 'repaired', 'verified', 'returned'] as const;
export const jobStatusSchema = z.enum(jobStatuses);
export type JobStatus = z.infer<typeof jobStatusSchema>;

export const jobStatusLabels: Record<JobStatus, string> = {
  received: 'Received',
  diagnosing: 'Diagnosing',
  'awaiting-review': 'Awaiting review',
  approved: 'Approved',
  repaired: 'Repaired',
  verified: 'Verified',
  returned: 'Returned',
};

export const priorities = ['low', 'normal', 'high'] as const;
export const prioritySchema = z.enum(priorities);
export type Priority = z.infer<typeof prioritySchema>;

export const jobSchema = z.object({
  id: idSchema,
  shopId: idSchema,
  /** The shop's running job number, shown on tags and paperwork. */
  number: z.number().int().positive(),
  customerId: idSchema,
  customerName: z.string(),
  unitDescription: z.string(),
  serial: z.string().nullable(),
  /** The serial of the unit the board came out of. */
  unitSerial: z.string().nullable(),
  boardId: idSchema,
  boardName: z.string(),
  boardVersionId: idSchema,
  boardVersion: z.number().int().positive(),
  faultCode: z.string().nullable(),
  symptom: z.string(),
  status: jobStatusSchema,
  /** True after a reviewer sent the diagnosis back, until it is proposed again. */
  sentBack: z.boolean(),
  proposedPart: z.string().nullable(),
  /** The technician's note with the proposal, for the reviewing lead. */
  proposalNote: z.string().nullable(),
  assigneeId: idSchema.nullable(),
  assigneeName: z.string().nullable(),
  priority: prioritySchema,
  receivedAt: isoDateTime,
  dueAt: isoDateTime.nullable(),
  /** When the board left the shop (returned to the customer). */
  closedAt: isoDateTime.nullable(),
  /** How it left: sent by courier or collected. */
  returnedVia: z.enum(returnMethods).nullable(),
  /** True when a lead lifted guided order for this job's trainee. */
  guidedLifted: z.boolean(),
  /** The meter the job's readings are taken with; null = the shop's default. */
  meterProfile: meterProfileIdSchema.nullable(),
  createdBy: idSchema,
  createdAt: isoDateTime,
  updatedAt: isoDateTime,
});
export type Job = z.infer<typeof jobSchema>;

export const jobDetailSchema = jobSchema.extend({
  customer: customerSchema,
  /**
   * The pinned board model version: its document and expected-readings table draw the bench map. The table is
   * the one computed for the job's meter (`meter`): Ω and diode values through junctions depend on the meter.
   */
  board: boardDetailSchema,
  /** The meter the expected values assume (the job's, else the shop's default, else none chosen). */
  meter: jobMeterSchema,
  /** Status changes the signed-in user may make now (through PATCH, or a review for approve/send back). */
  allowedTransitions: z.array(jobStatusSchema),
  /** Whether the signed-in user takes readings on this job in guided order only (policy: guidedOrderBinds). */
  guidedOrderRequired: z.boolean(),
  /** When a trainee is assigned: whether a lead lifted guided order on all of that trainee's jobs; null otherwise. */
  assigneeGuidedLifted: z.boolean().nullable(),
  reviews: z.array(reviewSchema),
  latestSnapshot: diagnosisSnapshotSchema.nullable(),
});
export type JobDetail = z.infer<typeof jobDetailSchema>;

export const jobListQuery = z.object({
  /** One status or several separated by commas: `?status=awaiting-review`. */
  status: z
    .string()
    .transform((s) => s.split(',').filter(Boolean))
    .pipe(z.array(jobStatusSchema))
    .optional(),
  /** `me` or a user id. */
  assignee: z.string().trim().min(1).max(100).optional(),
  customerId: idSchema.optional(),
  /** Searches the unit description, serial, symptom, fault code and customer name. */
  q: z.string().trim().max(200).optional(),
});
export type JobListQuery = z.input<typeof jobListQuery>;

export const jobListResponse = z.object({ items: z.array(jobSchema) });
export type JobList = z.infer<typeof jobListResponse>;

export const createJobRequest = z.object({
  /** One key per intake form: sending it again (a double click, a retry) answers the job it already made. */
  idempotencyKey: z.string().trim().min(8).max(100).optional(),
  customerId: idSchema,
  unitDescription: z.string().trim().min(1).max(300),
  serial: optionalText(100),
  unitSerial: optionalText(100),
  boardId: idSchema,
  /** Defaults to the board model's newest version. */
  boardVersion: counterSchema.optional(),
  faultCode: optionalText(20),
  symptom: z.string().trim().min(1).max(2000),
  priority: prioritySchema.default('normal'),
  assigneeId: idSchema.nullable().optional(),
  receivedAt: isoDateTimeInput.optional(),
  dueAt: isoDateTimeInput.nullable().optional(),
  /** The meter the readings will be taken with; omitted or null = the shop's default. */
  meterProfile: meterProfileIdSchema.nullable().optional(),
});
export type CreateJobRequest = z.input<typeof createJobRequest>;

export const updateJobRequest = z
  .object({
    status: jobStatusSchema,
    /** Required (here or already on the job) to move to awaiting review. */
    proposedPart: optionalText(50),
    /** A note for the reviewing lead, sent with the proposal. */
    proposalNote: optionalText(2000),
    /** Moving to returned: how the board left and when (defaults to now). */
    returnedVia: z.enum(returnMethods),
    returnedAt: isoDateTime,
    /** Signing off (to verified): the lead confirms the checklist's functional check was done. */
    functionalCheckDone: z.literal(true, { error: 'confirm the functional check' }),
    /** A lead lifts (true) or restores (false) guided order for this job's trainee. */
    guidedLifted: z.boolean(),
    assigneeId: idSchema.nullable(),
    priority: prioritySchema,
    unitDescription: z.string().trim().min(1).max(300),
    serial: optionalText(100),
    unitSerial: optionalText(100),
    faultCode: optionalText(20),
    symptom: z.string().trim().min(1).max(2000),
    dueAt: isoDateTimeInput.nullable(),
    /** The meter the readings are taken with (null = the shop's default); changed on the bench as well. */
    meterProfile: meterProfileIdSchema.nullable(),
  })
  .partial()
  .refine((o) => Object.keys(o).length > 0, 'nothing to change');
export type UpdateJobRequest = z.input<typeof updateJobRequest>;
