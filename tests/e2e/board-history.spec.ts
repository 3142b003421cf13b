// A board that comes back within the shop's warranty days is flagged at intake, with what was done to it last time;
// the new job shows the flag too. The spec makes its own board model, customer and earlier job through the API.
import { randomUUID } from 'node:crypto';
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { benchSetup, returnedJob } from './support/divider-job';

test('a warranty return is flagged at intake and on the job, in the bench’s words', async ({ page, shop }) => {
  test.setTimeout(120_000); // the earlier job's proposal runs the diagnosis of a new board model
  const setup = await benchSetup(shop);
  const serial = `BRD-${randomUUID().slice(0, 8)}`;
  const earlier = await returnedJob(setup, { serial });

  await signIn(page, shop.users.tech.email);
  for (const viewport of [
    { width: 1024, height: 768 },
    { width: 390, height: 844 },
  ]) {
    await page.setViewportSize(viewport);
    await page.goto('/jobs/new');
    await page.getByLabel('Board serial (optional)').fill(serial.toLowerCase());
    const flag = page.getByTestId('warranty-flag');
    await expect(flag).toContainText(`Warranty return — back 0 days after job #${earlier.number} left the shop`);
    await expect(flag).toContainText('R2 (10k) replaced by');
    // The earlier job opens to its repair and readings, in designators and test point labels.
    await page.getByText(`Job #${earlier.number}`, { exact: true }).click();
    await expect(page.getByRole('list', { name: 'Earlier jobs' })).toContainText('R2 replaced with 10k');
    await expect(page.getByRole('cell', { name: 'TP2 divider to bus negative, DC V, powered (verification)' })).toBeVisible();
    // Nothing wider than the screen.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width);
  }

  await page.getByLabel('Customer').selectOption(setup.customerId);
  await page.getByLabel('Board model').selectOption(setup.boardId);
  await page.getByLabel('Unit (make-free description, model line)').fill('Outdoor unit');
  await page.getByLabel('Symptom').fill('Fan stops after a minute');
  await page.getByRole('button', { name: 'Open the job' }).click();
  await page.waitForURL(/\/jobs\/[^/]+$/);
  await expect(page.getByTestId('warranty-flag')).toContainText(`after job #${earlier.number} left the shop`);
  await page.getByRole('link', { name: /This board was here before: 1 earlier job/ }).click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('earlier visits of this board');
  await expect(page.getByText(`Job #${earlier.number}`, { exact: true })).toBeVisible();
});
