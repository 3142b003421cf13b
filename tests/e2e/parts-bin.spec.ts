// The parts bin on the bench: a repair fitted from a drawer takes its stock (a drawer of another value is refused),
// the drawer falls on the reorder list, and the new quote starts from the part used. The spec makes its own data.
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { approvedJob, benchSetup, send } from './support/divider-job';

// The refused drawer is a 422 the page shows as an alert; the browser logs the refused request.
test.use({ expectedConsoleErrors: [/status of 422/] });

test('a repair takes a part from the bin; the drawer lands on the reorder list; the quote starts from it', async ({ page, shop }) => {
  test.setTimeout(120_000); // the job's proposal runs the diagnosis of a new board model
  const setup = await benchSetup(shop);
  const job = await approvedJob(setup);
  const drawer = `S${setup.tag.slice(0, 5)}`;
  await send(setup.tech, 'post', '/parts-bin', { value: '10k', package: '0805', rating: '0.125 W', drawer, quantity: 2, minimum: 2, unitCents: 40 });
  await send(setup.tech, 'post', '/parts-bin', { value: '1k', package: '0805', drawer: `${drawer}-1k`, quantity: 5, minimum: 1 });

  await signIn(page, shop.users.tech.email);
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto(`/jobs/${job.id}/repair`);
  const bin = page.getByLabel('Fitted from the parts bin (optional)');
  await bin.selectOption({ label: `1k 0805 · drawer ${drawer}-1k · 5 left` });
  await page.getByRole('button', { name: 'Save the repair' }).click();
  await expect(page.getByRole('alert')).toContainText("The drawer's part does not fit: R2 is 10k; this drawer holds 1k");

  await bin.selectOption({ label: `10k 0805 0.125 W · drawer ${drawer} · 2 left` });
  await page.getByRole('button', { name: 'Save the repair' }).click();
  await expect(page.getByText(/R2 replaced with 10k/).first()).toBeVisible();
  await expect(bin.locator('option', { hasText: `drawer ${drawer} · 1 left` })).toHaveCount(1);

  for (const viewport of [
    { width: 1024, height: 768 },
    { width: 390, height: 844 },
  ]) {
    await page.setViewportSize(viewport);
    await page.goto('/parts-bin');
    const reorder = page.getByRole('region', { name: 'Reorder list' });
    const row = reorder.getByRole('row').filter({ hasText: drawer }).filter({ hasText: '10k' });
    await expect(row).toContainText('under the minimum');
    await expect(row.getByRole('cell').nth(5)).toContainText('1');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width);
  }

  await page.goto(`/jobs/${job.id}/billing`);
  await expect(page.getByText('New quote (from the parts used and the labour rate)')).toBeVisible();
  await expect(page.getByLabel('Description (line 1)')).toHaveValue('R2: 10k 0805, 0.125 W');
  await expect(page.getByLabel('Description (line 2)')).toHaveValue('Bench labour (1 repair)');
});
