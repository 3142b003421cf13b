// What a job knows before its first reading, as the diagnosis engine's per-job prior adjustments: the fault code the
// unit showed (the shop's code table, the rule beside the contract's FAULT_CODE_WEIGHT) and the shop's verified
// failures (the engine's electrical/history.ts does the Dirichlet update; here they are only counted). The board's
// engine is not rebuilt: these travel with each update, and the diagnosis cache key names them.
import { createHash } from 'node:crypto';
import { and, desc, eq, inArray, isNull, ne, or, sql } from 'drizzle-orm';
import { FAULT_CODE_WEIGHT, measuredBand, type BoardModel } from '@splitscope/contract';
import type { FailureCount, FailureHistory, PartKind, PriorAdjustment, ReferenceBand } from '@splitscope/diagnosis';
import type { Db } from '../../db/client';
import { boardModelVersions, diagnosisSnapshots, faultCodes, jobs, repairActions } from '../../db/schema';
import { readStoredBoardModel } from '../boards';
import { measuredPoints } from '../references';

interface JobPriors {
  priors: PriorAdjustment[];
  history?: FailureHistory;
  /** Bands measured on the board model's known-good boards (evidence for "ok" where the model gives no value). */
  references?: ReferenceBand[];
  /** Stable digest of the above, part of the diagnosis cache key. */
  key: string;
}

interface JobFacts {
  id: string;
  shopId: string;
  boardId: string;
  boardVersionId: string;
  faultCode: string | null;
}

/** How many of a model's most recent verified jobs the history counts ("the last N boards"). */
const HISTORY_JOBS = 100;

// A version never changes: its parsed document is kept (bounded).
const documents = new Map<string, BoardModel>();
async function documentOf(versionId: string, load: () => Promise<unknown>): Promise<BoardModel> {
  let d = documents.get(versionId);
  if (!d) {
    const stored = readStoredBoardModel(await load(), { key: versionId, name: 'board' });
    // A document the schema rejects reads as a board without parts (no priors to steer); it is not kept, so the
    // corrected form a lead stores is what the next call reads.
    if (stored.problem) return stored.model;
    d = stored.model;
    documents.set(versionId, d);
    if (documents.size > 50) documents.delete(documents.keys().next().value as string);
  }
  return d;
}

/** The fault code's steer: a factor on every fault mode of each part in a suspect section. */
async function faultCodePriors(db: Db, job: JobFacts, doc: BoardModel): Promise<PriorAdjustment[]> {
  const code = job.faultCode?.trim();
  if (!code) return [];
  const rows = await db
    .select()
    .from(faultCodes)
    .where(
      and(
        eq(faultCodes.shopId, job.shopId),
        or(eq(faultCodes.boardId, job.boardId), isNull(faultCodes.boardId)),
        sql`lower(${faultCodes.code}) = lower(${code})`,
      ),
    );
  // The board's own entry wins over a shop-wide one with the same code.
  const row = rows.find((r) => r.boardId === job.boardId) ?? rows[0];
  if (!row) return [];
  const title = new Map(doc.sections.map((s) => [s.id, s.title]));
  const weightOf = (s: string) => row.weights[s] ?? FAULT_CODE_WEIGHT;
  const out: PriorAdjustment[] = [];
  for (const p of doc.parts) {
    if (!p.element || !row.sections.includes(p.section)) continue;
    const w = weightOf(p.section);
    if (!(w > 1)) continue;
    out.push({
      part: p.element,
      factor: w,
      source: 'fault-code',
      note: `fault code ${row.code} (${row.title}) points at the ${title.get(p.section) ?? p.section} section: ×${w}`,
    });
  }
  return out;
}

// Board part kinds the engine also knows by the same name (the rest are not counted across models).
const ENGINE_KINDS = new Set<string>(['resistor', 'ceramic-capacitor', 'electrolytic-capacitor', 'diode', 'led', 'bjt', 'opto-coupler', 'regulator']);

interface Failure {
  jobId: string;
  boardId: string;
  versionId: string;
  part: string;
}

/** The mode each failed part was in, from the job's last diagnosis snapshot (its likeliest mode of that part). */
async function modesOf(db: Db, failures: Failure[]): Promise<Map<string, string>> {
  const ids = [...new Set(failures.map((f) => f.jobId))];
  if (ids.length === 0) return new Map();
  const snaps = await db
    .selectDistinctOn([diagnosisSnapshots.jobId], { jobId: diagnosisSnapshots.jobId, parts: sql<unknown>`${diagnosisSnapshots.output}->'parts'` })
    .from(diagnosisSnapshots)
    .where(inArray(diagnosisSnapshots.jobId, ids))
    .orderBy(diagnosisSnapshots.jobId, desc(diagnosisSnapshots.createdAt));
  const out = new Map<string, string>();
  for (const s of snaps) {
    const parts = Array.isArray(s.parts) ? (s.parts as { designator?: string; mode?: string; probability?: number }[]) : [];
    for (const f of failures.filter((x) => x.jobId === s.jobId)) {
      const best = parts.filter((p) => p.designator?.toLowerCase() === f.part.toLowerCase()).sort((a, b) => (b.probability ?? 0) - (a.probability ?? 0))[0];
      if (best?.mode) out.set(`${f.jobId}\u0000${f.part.toLowerCase()}`, best.mode);
    }
  }
  return out;
}

async function historyOf(db: Db, job: JobFacts): Promise<FailureHistory | undefined> {
  const rows = await db
    .select({ jobId: jobs.id, boardId: jobs.boardId, versionId: jobs.boardVersionId, part: repairActions.part, updatedAt: jobs.updatedAt })
    .from(jobs)
    .innerJoin(repairActions, eq(repairActions.jobId, jobs.id))
    .where(
      and(
        eq(jobs.shopId, job.shopId),
        inArray(jobs.status, ['verified', 'returned']),
        ne(jobs.id, job.id),
        inArray(repairActions.action, ['replaced', 'removed']),
      ),
    )
    .orderBy(desc(jobs.updatedAt));
  if (rows.length === 0) return undefined;
  // One failure per part per job (a part replaced twice on one job failed once); the model's last HISTORY_JOBS jobs.
  const seen = new Set<string>();
  const failures: Failure[] = [];
  const jobsOf = new Map<string, string[]>();
  for (const r of rows) {
    const k = `${r.jobId}\u0000${r.part.toLowerCase()}`;
    if (seen.has(k)) continue;
    const list = jobsOf.get(r.boardId) ?? [];
    if (!list.includes(r.jobId)) {
      if (list.length >= HISTORY_JOBS) continue;
      list.push(r.jobId);
      jobsOf.set(r.boardId, list);
    }
    seen.add(k);
    failures.push(r);
  }
  const modes = await modesOf(db, failures);
  const mode = (f: Failure) => modes.get(`${f.jobId}\u0000${f.part.toLowerCase()}`);
  const count = <K extends string>(items: { key: K; mode?: string }[]): FailureCount<K>[] => {
    const m = new Map<string, FailureCount<K>>();
    for (const i of items) {
      const k = `${i.key}\u0000${i.mode ?? ''}`;
      const c = m.get(k);
      if (c) c.count++;
      else m.set(k, { key: i.key, ...(i.mode ? { mode: i.mode } : {}), count: 1 });
    }
    return [...m.values()];
  };

  const own = failures.filter((f) => f.boardId === job.boardId);
  const others = failures.filter((f) => f.boardId !== job.boardId);
  const history: FailureHistory = {};
  if (own.length) history.board = { jobs: jobsOf.get(job.boardId)?.length ?? 0, failures: count(own.map((f) => ({ key: f.part, mode: mode(f) }))) };
  if (others.length) {
    const versions = [...new Set(others.map((f) => f.versionId))];
    const docs = await db
      .select({ id: boardModelVersions.id, parts: sql<unknown>`${boardModelVersions.document}->'parts'` })
      .from(boardModelVersions)
      .where(inArray(boardModelVersions.id, versions));
    const kindOf = new Map<string, string>();
    for (const d of docs)
      for (const p of Array.isArray(d.parts) ? (d.parts as { designator?: string; kind?: string }[]) : [])
        if (p.designator && p.kind) kindOf.set(`${d.id}\u0000${p.designator.toLowerCase()}`, p.kind);
    const kinds = others.flatMap((f) => {
      const k = kindOf.get(`${f.versionId}\u0000${f.part.toLowerCase()}`);
      return k && ENGINE_KINDS.has(k) ? [{ key: k as PartKind, mode: mode(f) }] : [];
    });
    const otherJobs = new Set(others.map((f) => f.jobId)).size;
    if (kinds.length) history.kinds = { jobs: otherJobs, failures: count(kinds) };
  }
  return history.board || history.kinds ? history : undefined;
}

/** The job's prior adjustments and history, with the key that names them. */
export async function jobPriors(db: Db, job: JobFacts, loadDocument: () => Promise<unknown>): Promise<JobPriors> {
  const doc = await documentOf(job.boardVersionId, loadDocument);
  const [priors, history, measured] = await Promise.all([faultCodePriors(db, job, doc), historyOf(db, job), measuredPoints(db, job.shopId, job.boardId)]);
  const references = measured.map((p) => {
    const b = measuredBand(p.mode, p.values);
    return { mode: p.mode, power: p.power, red: p.red, black: p.black, low: b.low, high: b.high, boards: b.boards };
  });
  const key = priors.length || history || references.length ? createHash('md5').update(JSON.stringify({ priors, history, references })).digest('hex') : '';
  return { priors, ...(history ? { history } : {}), ...(references.length ? { references } : {}), key };
}
