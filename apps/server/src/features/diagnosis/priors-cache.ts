// The job's priors (priors.ts: three queries over the shop's fault codes, repair history and reference boards) kept
// with the readings key they were computed for, so the diagnosis read that follows each reading, and every poll
// while the readings stay the same, pays no query for them. They are computed again when the readings change (a
// new reading, a correction, a strike), when the job's fault code changes, when this process writes a shop-wide
// input (a fault code edited by a lead, a repair, a job verified or returned, a reference board measured:
// lib/priors-generation.ts), and at the latest after PRIORS_TTL_MS, so that another server process's writes
// reach an open job's diagnosis within that time even while no reading is added.
import { LRUCache } from 'lru-cache';
import type { Db } from '../../db/client';
import { priorsGeneration } from '../../lib/priors-generation';
import { jobPriors } from './priors';

type JobFacts = Parameters<typeof jobPriors>[1];
type JobPriors = Awaited<ReturnType<typeof jobPriors>>;

const PRIORS_TTL_MS = 60_000;

const kept = new LRUCache<string, { key: string; at: number; value: Promise<JobPriors> }>({ max: 500 });

export function cachedJobPriors(db: Db, job: JobFacts, readingsKey: string, loadDocument: () => Promise<unknown>): Promise<JobPriors> {
  const key = `${job.boardVersionId}|${job.faultCode ?? ''}|${readingsKey}|${priorsGeneration()}`;
  const hit = kept.get(job.id);
  if (hit && hit.key === key && Date.now() - hit.at < PRIORS_TTL_MS) return hit.value;
  const value = jobPriors(db, job, loadDocument);
  const entry = { key, at: Date.now(), value };
  kept.set(job.id, entry);
  // a failed query is not kept: the next request asks again
  value.catch(() => {
    if (kept.get(job.id) === entry) kept.delete(job.id);
  });
  return value;
}
