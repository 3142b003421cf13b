import { and, asc, desc, eq, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import { boardWords, METER_WORDS, warrantyReturn, wordsModelOf, type BoardHistory, type HistoryJob } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { boardModels, boardModelVersions, customers, jobs, readingStrikes, readings, repairActions, users } from '../../db/schema';
import { iso, isoOrNull } from '../../lib/dates';
import { getJobRow } from '../../db/job-row';
import { getServiceTerms } from '../service-terms';

const same = (column: typeof jobs.serial | typeof jobs.unitSerial, value: string) => sql`lower(${column}) = lower(${value})`;

/** How many readings of an earlier job the history shows: the verification set and the last diagnosis ones fit. */
const READINGS_PER_JOB = 40;

async function historyJobs(
  db: Db,
  shopId: string,
  serials: { serial?: string | null; unitSerial?: string | null },
  exclude?: { id: string; before: Date },
): Promise<HistoryJob[]> {
  const match: SQL[] = [];
  if (serials.serial) match.push(same(jobs.serial, serials.serial));
  if (serials.unitSerial) match.push(same(jobs.unitSerial, serials.unitSerial));
  if (!match.length) return [];
  const where: SQL[] = [eq(jobs.shopId, shopId), or(...match)!];
  if (exclude) where.push(sql`${jobs.id} <> ${exclude.id}`, sql`${jobs.receivedAt} < ${exclude.before.toISOString()}`);
  const rows = await db
    .select({ j: jobs, boardName: boardModels.name, customerName: customers.name, document: boardModelVersions.document })
    .from(jobs)
    .innerJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .innerJoin(boardModelVersions, eq(boardModelVersions.id, jobs.boardVersionId))
    .innerJoin(customers, eq(customers.id, jobs.customerId))
    .where(and(...where))
    .orderBy(desc(jobs.receivedAt))
    .limit(50);
  if (!rows.length) return [];
  const ids = rows.map((r) => r.j.id);
  const repairs = await db
    .select({ r: repairActions, byName: users.name })
    .from(repairActions)
    .innerJoin(users, eq(users.id, repairActions.authorId))
    .where(inArray(repairActions.jobId, ids))
    .orderBy(asc(repairActions.createdAt));
  // Struck readings and readings corrected by a later one are not what the board measured.
  const struck = db.select({ id: readingStrikes.readingId }).from(readingStrikes).where(inArray(readingStrikes.jobId, ids));
  const corrected = db
    .select({ id: readings.supersedes })
    .from(readings)
    .where(and(inArray(readings.jobId, ids), isNotNull(readings.supersedes)));
  const measured = await db
    .select({ r: readings, byName: users.name })
    .from(readings)
    .innerJoin(users, eq(users.id, readings.authorId))
    .where(and(inArray(readings.jobId, ids), sql`${readings.id} not in (${struck})`, sql`${readings.id} not in (${corrected})`))
    .orderBy(desc(readings.takenAt));

  return rows.map(({ j, boardName, customerName, document }) => {
    const words = boardWords(wordsModelOf(document));
    const matchedBy = serials.serial && j.serial?.toLowerCase() === serials.serial.toLowerCase() ? 'board serial' : 'unit serial';
    return {
      id: j.id,
      number: j.number,
      status: j.status,
      matchedBy,
      serial: j.serial,
      unitSerial: j.unitSerial,
      boardName,
      customerName,
      symptom: j.symptom,
      faultCode: j.faultCode,
      proposedPart: j.proposedPart ? words.designator(j.proposedPart) : null,
      receivedAt: iso(j.receivedAt),
      closedAt: isoOrNull(j.closedAt),
      repairs: repairs
        .filter(({ r }) => r.jobId === j.id)
        .map(({ r, byName }) => ({
          part: words.designator(r.part),
          action: r.action,
          replacementValue: r.replacementValue,
          marking: r.marking,
          byName,
          at: iso(r.createdAt),
        })),
      readings: measured
        .filter(({ r }) => r.jobId === j.id)
        .slice(0, READINGS_PER_JOB)
        .map(({ r, byName }) => ({
          where: `${words.probe(r.red)} to ${words.probe(r.black)}, ${METER_WORDS[r.mode]}, ${r.power === 'on' ? 'powered' : 'unpowered'}`,
          raw: r.raw,
          verdict: (r.verdict as { verdict?: 'ok' | 'low' | 'high' } | null)?.verdict ?? null,
          phase: r.phase,
          byName,
          takenAt: iso(r.takenAt),
        })),
    };
  });
}

/** At intake: the jobs a board (or unit) serial had before, and whether a board received now is a warranty return. */
export async function findBoardHistory({
  db,
  shopId,
  serial,
  unitSerial,
}: {
  db: Db;
  shopId: string;
  serial?: string;
  unitSerial?: string;
}): Promise<BoardHistory> {
  const { warrantyDays } = await getServiceTerms(db, shopId);
  const earlier = await historyJobs(db, shopId, { serial, unitSerial });
  return { warrantyDays, warranty: warrantyReturn(earlier, new Date().toISOString(), warrantyDays), jobs: earlier };
}

/** On a job: the jobs its board or unit serial had before this one was received, and the warranty flag then. */
export async function findJobHistory({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }): Promise<BoardHistory> {
  const job = await getJobRow(db, shopId, jobId);
  const { warrantyDays } = await getServiceTerms(db, shopId);
  const earlier = await historyJobs(db, shopId, { serial: job.serial, unitSerial: job.unitSerial }, { id: job.id, before: job.receivedAt });
  return { warrantyDays, warranty: warrantyReturn(earlier, iso(job.receivedAt), warrantyDays), jobs: earlier };
}
