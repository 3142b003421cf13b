import type { JobDetail, JobList } from '@splitscope/contract';
import type { Page } from '@playwright/test';
import { expect } from './fixtures';

/** GETs the API with the page's session cookie. */
export async function getJson<T>(page: Page, path: string): Promise<T> {
  const res = await page.request.get(`/api${path}`);
  expect(res.ok(), `GET ${path} → ${res.status()}`).toBe(true);
  return (await res.json()) as T;
}

/** Calls the API from inside the page (same origin, same cookies), as the app itself does. */
export async function fetchInPage(page: Page, path: string, init: { method: string; body?: unknown }) {
  return page.evaluate(
    async ({ path, init }: { path: string; init: { method: string; body?: unknown } }) => {
      const r = await fetch(`/api${path}`, {
        method: init.method,
        headers: { 'content-type': 'application/json' },
        body: init.body === undefined ? undefined : JSON.stringify(init.body),
      });
      return { status: r.status, body: (await r.json().catch(() => null)) as unknown };
    },
    { path, init },
  );
}

/** The first job in one of the statuses, as the signed-in user sees them. */
export async function findJob(page: Page, statuses: string[], extra = ''): Promise<JobDetail> {
  const list = await getJson<JobList>(page, `/jobs?status=${statuses.join(',')}${extra}`);
  expect(list.items.length, `a demo job in ${statuses.join('/')}`).toBeGreaterThan(0);
  return getJson<JobDetail>(page, `/jobs/${list.items[0]!.id}`);
}

export const shot = (page: Page, name: string) => page.screenshot({ path: `tests/artifacts/${name}.png`, fullPage: true });

interface Probe {
  mode: string;
  red: string;
  black: string;
  power: string;
  lifted?: string[];
}

/** The expected-table row for a probe (test point ids and their nets are the same place). */
/** The net a probe name stands for on the job's board (a test point id or a net name), lower case. */
export function probeNet(job: JobDetail, probe: string): string {
  const doc = job.board.document as { testPoints?: { id: string; net: string }[] };
  return (doc.testPoints?.find((p) => p.id.toLowerCase() === probe.toLowerCase())?.net ?? probe).toLowerCase();
}

export function expectedRowFor(job: JobDetail, t: Probe) {
  const net = (s: string) => probeNet(job, s);
  const lifted = (l?: string[]) => [...(l ?? [])].sort().join();
  return job.board.expectedReadings.find(
    (r) => r.mode === t.mode && r.power === t.power && net(r.red) === net(t.red) && net(r.black) === net(t.black) && lifted(r.lifted) === lifted(t.lifted),
  );
}

/** What a technician types for a value: plain SI numbers, or OL. */
export const typed = (v: number | 'OL' | boolean) => (v === 'OL' ? 'OL' : typeof v === 'boolean' ? (v ? '0' : 'OL') : String(Number(v.toPrecision(4))));

/**
 * Waits until the page has loaded and no API request has been in flight for `quietMs` (the app marks the count on
 * `<html data-requests>`), e.g. before reading a whole page's text: the ranking arrives after the page does.
 */
export async function settled(page: Page, quietMs = 150): Promise<void> {
  await page.waitForLoadState('load');
  await page.waitForFunction(
    (quiet) => {
      const w = window as unknown as { __idleSince?: number };
      if (document.documentElement.dataset.requests !== '0') {
        w.__idleSince = undefined;
        return false;
      }
      w.__idleSince ??= performance.now();
      return performance.now() - w.__idleSince >= quiet;
    },
    quietMs,
    { polling: 50, timeout: 60_000 },
  );
}
