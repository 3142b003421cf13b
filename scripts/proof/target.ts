// What the proof runs write and read: readings on a demo job, through the same routes the web client uses.
import { randomUUID } from 'node:crypto';
import type { CreateReadingRequest } from '../../packages/contract/src/index';
import type { Session } from './env';

export interface ReadingTarget {
  jobId: string;
  body(i: number, key?: string): CreateReadingRequest;
}

interface JobList {
  items: { id: string; shopId: string }[];
}
interface JobDetail {
  id: string;
  board?: { document?: { testPoints?: { id: string; reference?: string; modes?: string[]; powerStates?: string[] }[] } };
}

async function getJson<T>(url: string, session: Session): Promise<T> {
  const r = await fetch(url, { headers: { cookie: session.cookie }, signal: AbortSignal.timeout(10_000) });
  if (!r.ok) throw new Error(`GET ${url} answered ${r.status}`);
  return (await r.json()) as T;
}

/** A job of the signed-in technician's shop (the first, unless `skip` names one not to use), with a probe pair its board model knows. */
export async function readingTarget(baseUrl: string, session: Session, skip?: string): Promise<ReadingTarget> {
  let jobs: JobList;
  try {
    jobs = await getJson<JobList>(`${baseUrl}/api/jobs`, session);
  } catch (err) {
    throw new Error(`no job to write readings to: ${(err as Error).message} (the jobs and readings API must be there)`, { cause: err });
  }
  const job = jobs.items.find((j) => j.id !== skip) ?? jobs.items[0];
  if (!job) throw new Error('no job to write readings to: the demo seed has no jobs for this shop');
  const detail = await getJson<JobDetail>(`${baseUrl}/api/jobs/${encodeURIComponent(job.id)}`, session);
  const tp = detail.board?.document?.testPoints?.find((t) => t.modes?.includes('dcv') && t.powerStates?.includes('on'));
  const red = tp?.id ?? 'GND';
  const black = tp?.reference || 'GND';
  return {
    jobId: job.id,
    body: (i, key = randomUUID()) => ({
      idempotencyKey: key,
      mode: 'dcv',
      red,
      black,
      power: 'on',
      lifted: [],
      value: 14.9 + (i % 7) / 100,
      raw: `${(14.9 + (i % 7) / 100).toFixed(2)} V`,
      phase: 'diagnosis',
    }),
  };
}

export const readingsPath = (jobId: string) => `/api/jobs/${encodeURIComponent(jobId)}/readings`;
