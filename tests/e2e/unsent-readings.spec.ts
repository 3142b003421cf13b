import type { ReadingList } from '@splitscope/contract';
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { getJson, shot } from './helpers';
import { createJob } from './support/shop-data';

test.describe('readings typed while the network is down', () => {
  // One pattern: a two-element array whose second element is an object reads as Playwright's [value, options].
  test.use({ expectedConsoleErrors: [/ERR_INTERNET_DISCONNECTED|Failed to fetch/] });

  test('are kept, listed as unsent and sent once with the same key when the network returns', async ({ page, context, shop }) => {
    await signIn(page, shop.users.tech.email);
    await expect(page.getByRole('heading', { name: /Welcome/ })).toBeVisible();
    const job = await createJob(page, { faultCode: 'F7', assigneeId: shop.users.tech.id });
    const before = (await getJson<ReadingList>(page, `/jobs/${job.id}/readings`)).items.length;
    // The test-point list is a view of its own beside the map.
    await page.goto(`/jobs/${job.id}?mode=free&tab=points`);
    await page.getByRole('navigation', { name: 'Test points' }).getByRole('button').first().click();
    await expect(page.getByLabel('Measured value')).toBeFocused();
    await page.getByLabel('Measured value').fill('14.9');
    await context.setOffline(true);
    await page.getByLabel('Measured value').press('Enter');
    await expect(page.getByTestId('unsent')).toContainText('1 reading not sent yet');
    await expect(page.getByTestId('verdict')).toContainText('UNSENT');
    await shot(page, 'unsent-offline');
    await context.setOffline(false);
    // Sent on the browser's "online" event; the server then stores it and answers (seconds on a busy machine).
    await expect(page.getByTestId('unsent')).toHaveCount(0, { timeout: 20_000 });
    const after = await getJson<ReadingList>(page, `/jobs/${job.id}/readings`);
    expect(after.items.length).toBe(before + 1);
    expect(after.items.at(-1)!.raw).toBe('14.9');
  });
});
