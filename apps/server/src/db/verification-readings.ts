// A job's stored verification readings that count, for the sign-off check (jobs) and for keeping a verified
// board's readings as a reference (references). It lives beside the schema, like job-row.ts, so neither feature
// imports the other; which readings count is the contract's one definition (`verificationReadings`).
import { and, asc, desc, eq } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { verificationReadings } from '@splitscope/contract';
import { iso } from '../lib/dates';
import type { Db } from './client';
import { readingStrikes, readings, repairActions } from './schema';

/** Whether a repair action is recorded, and the verification readings that count after the last one. */
export async function countingVerificationReadings(db: Db, jobId: string) {
  const [last] = await db
    .select({ at: repairActions.createdAt })
    .from(repairActions)
    .where(eq(repairActions.jobId, jobId))
    .orderBy(desc(repairActions.createdAt))
    .limit(1);
  const later = alias(readings, 'later');
  const taken = await db
    .select({ r: readings, supersededBy: later.id, struck: readingStrikes.id })
    .from(readings)
    .leftJoin(later, eq(later.supersedes, readings.id))
    .leftJoin(readingStrikes, eq(readingStrikes.readingId, readings.id))
    .where(and(eq(readings.jobId, jobId), eq(readings.phase, 'verification')))
    .orderBy(asc(readings.createdAt));
  const rows = verificationReadings(
    taken.map(({ r, supersededBy, struck }) => ({ ...r, supersededBy, struck, createdAt: iso(r.createdAt), verdict: r.verdict as { verdict: string } | null })),
    last ? iso(last.at) : null,
  );
  return { repaired: !!last, rows };
}
