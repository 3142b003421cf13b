// The lead's statistics page: each chart with its table, the spec's own repaired board and its warranty return in
// the figures, at a tablet's and a phone's width. Also takes the page's picture for the docs.
import { randomUUID } from 'node:crypto';
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { benchSetup, returnedJob, send } from './support/divider-job';

test('the statistics page shows failures by part, time to verification, repeat returns and money, each over its table', async ({ page, shop }) => {
  test.setTimeout(120_000); // the earlier job's proposal runs the diagnosis of a new board model
  const setup = await benchSetup(shop);
  const serial = `BRD-${randomUUID().slice(0, 8)}`;
  const first = await returnedJob(setup, { serial });
  const back = await send<{ number: number }>(setup.tech, 'post', '/jobs', {
    customerId: setup.customerId,
    boardId: setup.boardId,
    unitDescription: 'Outdoor unit',
    serial,
    symptom: 'Fan stops again',
  });

  await signIn(page, shop.users.lead.email);
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/stats');
  const parts = page.getByRole('region', { name: 'Failures by part and board model' });
  await expect(parts.getByRole('row').filter({ hasText: `Divider test board ${setup.tag}` })).toContainText('R2');
  await expect(parts.locator('canvas')).toBeVisible();
  const repeats = page.getByRole('region', { name: 'First-time fix and repeat returns' });
  await expect(repeats.getByRole('row').filter({ hasText: serial })).toContainText(`#${back.number}`);
  await expect(repeats.getByRole('row').filter({ hasText: serial })).toContainText(`#${first.number}`);
  await expect(
    page
      .getByRole('region', { name: 'Intake to verification readings' })
      .getByRole('row')
      .filter({ hasText: `Divider test board ${setup.tag}` }),
  ).toBeVisible();
  await expect(page.getByRole('region', { name: 'Money: quoted, invoiced, paid' }).getByRole('columnheader', { name: 'Invoiced' })).toBeVisible();
  await page.screenshot({ path: 'docs/screens/2026-12-05-stats.png', fullPage: true });

  await page.setViewportSize({ width: 390, height: 844 });
  await expect(parts.locator('canvas')).toBeVisible();
  // The charts follow the new width on their resize observer's next frame, not at once.
  await expect.poll(() => page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
