import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';
import { signIn } from './fixtures';
import { apiAs, send } from './support/divider-job';
import { expect, test, type TestShop } from './support/own-shop';
import { createJob } from './support/shop-data';
import { readingRequest } from '../../apps/server/src/testing/requests';

async function noSeriousViolations(page: Page, name: string) {
  await page.screenshot({ path: `tests/artifacts/axe-${name}.png`, fullPage: true });
  const r = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const bad = r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    bad.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`),
    `${name}: serious or critical violations`,
  ).toEqual([]);
}

test('sign-in has no serious accessibility violations', async ({ page }) => {
  await page.goto('/sign-in');
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();
  await noSeriousViolations(page, 'sign-in');
});

/** A job of the shop's own that the tech proposed a part on: the lead's review queue and review page show it. */
async function jobInReview(shop: TestShop) {
  const tech = await apiAs(shop.users.tech.email);
  const customer = await send<{ id: string }>(tech, 'post', '/customers', { name: 'Axe Cooling', kind: 'contractor' });
  const job = await send<{ id: string; number: number }>(tech, 'post', '/jobs', {
    customerId: customer.id,
    boardId: shop.boards.outdoorFan,
    unitDescription: 'Outdoor unit',
    symptom: 'Fan never starts',
  });
  await send(tech, 'post', `/jobs/${job.id}/readings`, readingRequest({ mode: 'dcv', red: 'TP3', black: '0', power: 'on', value: 14.98 }));
  await send(tech, 'patch', `/jobs/${job.id}`, { status: 'awaiting-review', proposedPart: 'C9' });
  await tech.dispose();
  return job;
}

test('the technician views have no serious accessibility violations', async ({ page, shop }) => {
  test.setTimeout(120_000); // the first diagnosis on the shop's own board version builds its model
  await signIn(page, shop.users.tech.email);
  const job = await createJob(page, { assigneeId: shop.users.tech.id });
  await expect(page.getByRole('heading', { name: /Welcome/ })).toBeVisible();
  await expect(page.getByRole('heading', { name: 'My open jobs' })).toBeVisible();
  await noSeriousViolations(page, 'home-tech');

  await page.goto('/jobs');
  await expect(page.getByRole('table')).toBeVisible();
  await noSeriousViolations(page, 'jobs');

  await page.goto('/jobs/new');
  await expect(page.getByRole('button', { name: 'Open the job' })).toBeVisible();
  await noSeriousViolations(page, 'intake');

  await page.goto(`/jobs/${job.id}?mode=free`);
  await expect(page.getByTestId('board-map').locator('canvas').first()).toBeVisible();
  // The first diagnosis of a board version builds its model: seconds on a busy machine.
  await expect(page.getByRole('heading', { name: 'Probable faulty parts' })).toBeVisible({ timeout: 60_000 });
  await noSeriousViolations(page, 'bench');

  await page.goto(`/jobs/${job.id}?mode=free&tab=chain`);
  await expect(page.getByRole('table', { name: 'Signal chain readings' })).toBeVisible({ timeout: 30_000 });
  await noSeriousViolations(page, 'signal-chain');

  await page.goto(`/jobs/${job.id}?mode=guided`);
  await expect(page.getByRole('heading', { name: /Guided order/ })).toBeVisible();
  await noSeriousViolations(page, 'guided');

  await page.goto(`/jobs/${job.id}/report`);
  await expect(page.getByRole('heading', { name: /Repair report/ })).toBeVisible();
  await noSeriousViolations(page, 'report');

  await page.goto('/references');
  await expect(page.getByTestId('calc-bleed')).toBeVisible();
  await noSeriousViolations(page, 'references');
});

test('the lead and admin views have no serious accessibility violations', async ({ page, shop }) => {
  test.setTimeout(120_000); // the proposal's diagnosis on the shop's own board version builds its model
  const inReview = await jobInReview(shop);
  await signIn(page, shop.users.lead.email);
  await expect(page.getByRole('heading', { name: 'Review queue' })).toBeVisible();
  await noSeriousViolations(page, 'home-lead');
  await page.goto('/review');
  await expect(page.getByRole('heading', { name: 'Review queue' })).toBeVisible();
  await noSeriousViolations(page, 'review-queue');
  await page.goto('/boards');
  await expect(page.getByRole('link', { name: 'Open the editor' }).first()).toBeVisible();
  await noSeriousViolations(page, 'board-library');
  await page.getByRole('link', { name: 'Open the editor' }).first().click();
  await expect(page.getByRole('heading', { name: /Expected readings/ })).toBeVisible({ timeout: 30_000 });
  await noSeriousViolations(page, 'board-editor');

  // The spec's job in review: the ranking when proposed, the readings history and the decision.
  await page.goto(`/jobs/${inReview.id}/review`);
  await expect(page.getByTestId('proposed-part')).toBeVisible({ timeout: 60_000 });
  await noSeriousViolations(page, 'review-job');
  await page.goto(`/jobs/${inReview.id}/billing`);
  await expect(page.getByRole('heading', { name: `Billing · job #${inReview.number}` })).toBeVisible();
  await noSeriousViolations(page, 'job-billing');
});

test('the admin-only views have no serious accessibility violations', async ({ page, shop }) => {
  test.setTimeout(120_000); // the editor's first load of the shop's own board version
  await signIn(page, shop.users.admin.email);
  await page.goto('/billing/settings');
  await expect(page.getByRole('heading', { name: 'Billing settings' })).toBeVisible();
  await noSeriousViolations(page, 'billing-settings');
  await page.goto(`/boards/${shop.boards.indoorFan}`);
  // The editor's first load of a board version draws its map and composition: slow on a busy machine.
  await expect(page.getByRole('heading', { name: 'Compose from section templates' })).toBeVisible({ timeout: 30_000 });
  await noSeriousViolations(page, 'board-editor-compose');
});
