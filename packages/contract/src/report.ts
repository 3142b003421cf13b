import { z } from 'zod';
import { idSchema, isoDateTime } from './common';
import { jobStatusSchema } from './jobs';
import { shopCardSchema } from './shop';
import { readingSchema, type ReadingPhase } from './readings';
import { repairSchema } from './repairs';

/** A reading as the report shows it: where the probes were, the meter function, what it read against the band. */
export const reportReadingSchema = readingSchema
  .pick({
    id: true,
    red: true,
    black: true,
    mode: true,
    power: true,
    lifted: true,
    alone: true,
    beep: true,
    value: true,
    unit: true,
    raw: true,
    verdict: true,
    takenAt: true,
  })
  .extend({
    /** Where the probes were, in the bench's words ("TP5 Fan control supply to bus negative"). */
    probes: z.string(),
    /** The board's state for the reading: "powered", "unplugged, C10 lifted". */
    boardState: z.string(),
  });
export type ReportReading = z.infer<typeof reportReadingSchema>;

/**
 * The repair report: one model that the web's report page, the PDF for the customer and the e-mail that carries
 * it all render (GET /api/jobs/:id/report).
 */
export const repairReportSchema = z.object({
  jobId: idSchema,
  jobNumber: z.number().int().positive(),
  shop: shopCardSchema,
  customer: z.object({ name: z.string(), company: z.string().nullable() }),
  unit: z.string(),
  serial: z.string().nullable(),
  board: z.string(),
  boardVersion: z.number().int().positive(),
  faultCode: z.string().nullable(),
  symptom: z.string(),
  status: jobStatusSchema,
  receivedAt: isoDateTime,
  /** The part found faulty, and who approved the diagnosis. */
  finding: z.object({ part: z.string().nullable(), reviewedBy: z.string().nullable(), reviewedAt: isoDateTime.nullable() }),
  /** Current diagnosis readings outside their healthy band, and those taken with a part lifted to isolate it: what found the fault. */
  foundBy: z.array(reportReadingSchema),
  repairs: z.array(
    repairSchema.pick({ id: true, part: true, action: true, replacementValue: true, marking: true, notes: true, authorName: true, createdAt: true }),
  ),
  /** See `verificationReadings`. */
  verification: z.array(reportReadingSchema),
  /** Signed off: the report may go to the customer. */
  verified: z.boolean(),
});
export type RepairReport = z.infer<typeof repairReportSchema>;

/**
 * The one definition of a job's verification readings: verification-phase readings that no later reading
 * corrects and nobody struck out, taken after the last repair action (earlier ones checked a repair that was
 * redone). The sign-off check and the report both use it, so the customer never sees a reading the shop struck
 * out or corrected.
 */
export function verificationReadings<R extends { phase: ReadingPhase; supersededBy: string | null; struck: unknown; createdAt: string }>(
  readings: readonly R[],
  lastRepairAt: string | null,
): R[] {
  if (!lastRepairAt) return [];
  const after = Date.parse(lastRepairAt);
  return readings.filter((r) => r.phase === 'verification' && r.supersededBy === null && r.struck == null && Date.parse(r.createdAt) > after);
}
