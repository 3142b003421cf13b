// "Reading saved → ranking updated on screen", as a technician sees it: the bench page of a fresh job on the
// demo outdoor board, a DC V reading typed and Enter pressed, ~30 times. Each time is taken in the page, from the
// Enter key to the moment the ranking's `data-readings` marker names a reading other than the one before (the
// ranking is drawn from the new reading), so neither Playwright's polling nor its round trips count.
import { chromium, type Page } from '@playwright/test';
import playwrightConfig from '../../playwright.config';
import { DEMO_BOARD_IDS, JOB_DEFAULTS } from '../../apps/server/src/testing/requests';
import { removeCluster } from '../lib/pg';
import { waitForDictionary } from './bench-load';
import { percentile, proofClusterSpec, proofDatabase, ServerChild } from './env';

export interface SaveFigures {
  saves: number;
  p50: number;
  p95: number;
  max: number;
  /** Seconds waited for the demo board's fault dictionary before the first save. */
  dictionaryWait: number;
}

// Page code as strings: the scripts project has no DOM types. Armed before each Enter: the key's time, then the
// first change of the ranking's marker to another last reading.
const ARM = `(() => {
  const key = () => document.querySelector('[data-testid="ranking"]')?.getAttribute('data-readings') ?? '';
  const last = (k) => k.split(':')[1] ?? '';
  const before = last(key());
  window.__saved = undefined; window.__ranked = undefined;
  document.addEventListener('keydown', (e) => { if (e.key === 'Enter') window.__saved = performance.now(); }, { capture: true, once: true });
  const seen = () => {
    if (window.__saved !== undefined && last(key()) !== before && last(key()) !== '') {
      window.__ranked = performance.now();
      observer.disconnect();
    }
  };
  const observer = new MutationObserver(seen);
  observer.observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['data-readings'] });
})()`;

/** The DC V test at TP3 (15 V rail), powered: no safety gate, a value a technician types in a second. */
async function pickTest(page: Page): Promise<void> {
  await page.getByRole('tab', { name: 'Test points' }).click();
  await page
    .getByRole('navigation', { name: 'Test points' })
    .getByRole('button', { name: /^TP3 15 V rail/ })
    .click();
  await page.getByRole('button', { name: /DC V · powered/ }).click();
}

async function save(page: Page, value: string): Promise<number> {
  // The bench may move on after a save; the same test is picked again, before the clock starts.
  if (!(await page.getByLabel('Measured value').isVisible())) await pickTest(page);
  await page.evaluate(ARM);
  await page.getByLabel('Measured value').fill(value);
  await page.getByLabel('Measured value').press('Enter');
  await page.waitForFunction('window.__ranked !== undefined', undefined, { timeout: 60_000 });
  return (await page.evaluate('window.__ranked - window.__saved')) as number;
}

export async function measureSaveToRanking(saves: number, log: (line: string) => void): Promise<SaveFigures> {
  const spec = proofClusterSpec('pg-bench');
  let server: ServerChild | null = null;
  const browser = await chromium.launch(playwrightConfig.use?.launchOptions);
  try {
    const db = await proofDatabase(spec, 'splitscope_web');
    server = await ServerChild.create(db.url, 'bench-web-server.log', { LOCAL_FAKES: '0' });
    await server.start();
    // The page's CSP forbids string evaluation, which the in-page timers use; the app's own code is unaffected.
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 }, baseURL: server.url, bypassCSP: true });
    const signIn = await page.request.post('/api/auth/sign-in', { data: { email: 'tech@demo.test', password: 'splitscope-demo' } });
    if (signIn.status() !== 204) throw new Error(`sign-in answered ${signIn.status()}`);
    const created = await page.request.post('/api/jobs', {
      data: { ...JOB_DEFAULTS, customerId: 'customer-coastline', boardId: DEMO_BOARD_IDS.outdoorFan, assigneeId: 'user-tech' },
    });
    if (created.status() !== 201) throw new Error(`a job for the run answered ${created.status()}: ${await created.text()}`);
    const jobId = ((await created.json()) as { id: string }).id;
    const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
    const dictionaryWait = await waitForDictionary(server.url, { cookie }, jobId, log);
    await page.goto(`/jobs/${jobId}?mode=free`);
    await pickTest(page);
    await page.getByTestId('ranking').waitFor();
    // The first save opens the job's engine on the server; it is measured with the rest.
    const times: number[] = [];
    for (let i = 0; i < saves; i++) times.push(await save(page, (14.6 + (i % 9) / 10).toFixed(2)));
    const sorted = [...times].sort((a, b) => a - b);
    return { saves, p50: percentile(sorted, 50), p95: percentile(sorted, 95), max: sorted[sorted.length - 1]!, dictionaryWait };
  } finally {
    await browser.close();
    await server?.kill('SIGKILL');
    removeCluster(spec);
  }
}
