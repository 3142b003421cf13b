// Simulator internals stay inside the engine: every page of the demo, as each role, is read for text that looks
// like a netlist element ("XU1", "XVREG"), a fault mode id ("dl:open", "q1:be-open"), a meter mode id or an
// arrow to a bare net ("la → 0"). The bench is visited in each of its views, with the ranking and next tests.
import type { Page } from '@playwright/test';
import { expect, signIn, test } from './fixtures';
import { settled } from './helpers';
import { jobsInEachStatus } from './support/job-states';

const INTERNAL: [string, RegExp][] = [
  ['a fault mode id', /\b[a-z]{1,3}\d?:(open|short|be-open|bc-open|ce-short|be-short|drift|leaky)\b/],
  ['a subcircuit element name', /\bX[A-Z]+\d*\b/],
  ['an internal element path', /\bX[A-Z0-9]+\.[A-Z]+\d*\b/i],
  ['a meter mode id', /\b(dcv|ohm)\b/],
  ['an arrow to a bare net', /\b[a-z]{1,6}\d? → 0\b/],
];

async function pageText(page: Page): Promise<string> {
  // The ranking and next tests arrive after the page (diagnosis in a worker thread): read once nothing is in flight.
  await settled(page);
  return page.locator('body').innerText();
}

function check(text: string, where: string) {
  for (const [what, re] of INTERNAL) {
    const m = re.exec(text);
    expect(m, `${where} shows ${what}: “${m ? text.slice(Math.max(0, m.index - 40), m.index + 40) : ''}”`).toBeNull();
  }
}

// Pages a role may not use answer 403 (and say so on the page); the browser logs those.
test.use({ expectedConsoleErrors: [/status of 403/] });

// The board editor (/boards/:id) is left out on purpose: it is where a board's author edits the SPICE netlist,
// whose element and net names are its material.
const SHOP_PAGES = ['/', '/jobs', '/jobs/new', '/review', '/history', '/customers', '/parts-bin', '/stats', '/boards', '/references'];
const ADMIN_PAGES = ['/billing/settings', '/people', '/shop', '/shop/terms', '/account', '/dev/mail'];
// Every view of a job: the bench's four tabs, review, repair, report, billing and the board's history.
const jobViews = (id: string) => [
  `/jobs/${id}?mode=free`,
  `/jobs/${id}?mode=free&tab=readings`,
  `/jobs/${id}?mode=free&tab=points`,
  `/jobs/${id}?mode=free&tab=chain`,
  `/jobs/${id}/review`,
  `/jobs/${id}/repair`,
  `/jobs/${id}/report`,
  `/jobs/${id}/billing`,
  `/jobs/${id}/history`,
];
// What the engine says does not depend on who reads it; what a role sees of it does. The admin reads every view of
// one job per status (each status shows other parts of the bench, review, repair and report); the
// other roles read the shop's pages and each job as they open it (a trainee's guided bench) and its review.
const roleViews = (id: string) => [`/jobs/${id}`, `/jobs/${id}/review`];

// A job of the walk's own in each status on the demo fan-drive board (its opto, regulator and transistor models
// are where internal names could leak), made once for the four roles.
let walkJobs: ReturnType<typeof jobsInEachStatus>;
test.beforeAll(() => {
  walkJobs = jobsInEachStatus();
});

for (const email of ['admin@demo.test', 'lead@demo.test', 'tech@demo.test', 'trainee@demo.test']) {
  const admin = email.startsWith('admin');
  test(`no simulator-internal name on any page as ${email.split('@')[0]}`, async ({ page }) => {
    test.setTimeout(300_000); // a first diagnosis per job takes the engine seconds on a busy machine
    await signIn(page, email);
    const pages = [...SHOP_PAGES, ...ADMIN_PAGES];
    for (const id of (await walkJobs).values()) pages.push(...(admin ? jobViews(id) : roleViews(id)));
    for (const path of pages) {
      await page.goto(path);
      check(await pageText(page), `${path} as ${email}`);
    }
    // The full ranking too, not only its first eight.
    await page.goto(`/jobs/${(await walkJobs).get('diagnosing')}?mode=free`);
    await settled(page);
    const all = page.getByRole('button', { name: /Show all \d+ candidates/ });
    if (await all.count()) await all.click();
    check(await pageText(page), `the full ranking as ${email}`);
  });
}
