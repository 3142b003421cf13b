import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import { CaseError, type CaseReading } from '@splitscope/diagnosis';
import type { Diagnosis, DiagnosisSnapshot } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { boardModelVersions, diagnosisSnapshots, readings, type jobs } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { boardEngine, unitOf } from '../boards/engine';

/** Stored with every snapshot, so an old diagnosis can be told apart from what today's engine would say. */
export const ENGINE_VERSION = (() => {
  const pkg = JSON.parse(readFileSync(fileURLToPath(new URL('../../../../../packages/diagnosis/package.json', import.meta.url)), 'utf8')) as { name: string; version: string };
  return `${pkg.name}@${pkg.version}`;
})();

type ReadingRow = typeof readings.$inferSelect;

/** The readings the diagnosis works from: diagnosis-phase rows that no later row corrects, oldest first. */
export async function currentDiagnosisReadings(db: Db, jobId: string): Promise<ReadingRow[]> {
  const corrected = db.select({ id: readings.supersedes }).from(readings).where(and(eq(readings.jobId, jobId), sql`${readings.supersedes} is not null`));
  return db
    .select()
    .from(readings)
    .where(and(eq(readings.jobId, jobId), eq(readings.phase, 'diagnosis'), sql`${readings.id} not in (${corrected})`))
    .orderBy(asc(readings.takenAt), asc(readings.createdAt));
}

const caseValue = (r: ReadingRow): CaseReading['value'] => {
  if (r.mode === 'continuity') return r.beep ?? !r.overLimit;
  return r.overLimit ? 'OL' : r.value!;
};

/** Runs the diagnosis engine on a job's current readings against its pinned board model version. */
export async function computeDiagnosis({ db, job }: { db: Db; job: typeof jobs.$inferSelect }): Promise<Diagnosis> {
  const [version] = await db.select().from(boardModelVersions).where(eq(boardModelVersions.id, job.boardVersionId));
  if (!version) throw new AppError('not_found', `No board model version ${job.boardVersionId}`);
  const engine = boardEngine(version.id, version.document);
  const rows = await currentDiagnosisReadings(db, job.id);
  const input: CaseReading[] = rows.map((r) => ({ mode: r.mode, red: r.redNet, black: r.blackNet, power: r.power, lifted: r.lifted, value: caseValue(r) }));
  let out;
  try {
    out = engine.diagnoser.update(input);
  } catch (err) {
    if (err instanceof CaseError) throw new AppError('conflict', `The diagnosis engine cannot use these readings: ${err.message}`);
    throw err;
  }
  return {
    ...out,
    jobId: job.id,
    boardVersionId: version.id,
    engineVersion: ENGINE_VERSION,
    readings: out.readings.map((rep) => {
      const r = rows[rep.index]!;
      return {
        readingId: r.id,
        mode: r.mode,
        red: r.red,
        black: r.black,
        power: r.power,
        lifted: r.lifted,
        value: r.overLimit ? 'OL' : r.value!,
        unit: unitOf(r.mode),
        expected: rep.expected,
        low: rep.low ?? null,
        high: rep.high ?? null,
        verdict: rep.verdict,
      };
    }),
  };
}

export const toSnapshot = (s: typeof diagnosisSnapshots.$inferSelect): DiagnosisSnapshot => ({
  id: s.id,
  jobId: s.jobId,
  engineVersion: s.engineVersion,
  proposedPart: s.proposedPart,
  createdBy: s.createdBy,
  createdAt: iso(s.createdAt),
  output: s.output as Diagnosis,
});

export async function findSnapshots({ db, jobId }: { db: Db; jobId: string }) {
  const rows = await db.select().from(diagnosisSnapshots).where(eq(diagnosisSnapshots.jobId, jobId)).orderBy(desc(diagnosisSnapshots.createdAt));
  return { items: rows.map(toSnapshot) };
}
