// A meter's CSV log imported onto a job: the technician maps the columns once for the meter, previews (one clear
// error per bad row, nothing stored), binds a row without a test point by hand, and imports the good rows.
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { benchSetup, send } from './support/divider-job';

const LOG = [
  'Time;Point;Reading;Unit;Function',
  '2026-12-05T09:00:00Z;TP1;14,9;V;DCV',
  '2026-12-05T09:00:05Z;TP2;7.48;;VOLT:DC',
  '2026-12-05T09:00:10Z;TP9;7.5;V;DCV',
  '2026-12-05T09:00:15Z;TP2;banana;;DCV',
  '2026-12-05T09:00:20Z;;15.1;V;DCV',
  '2026-12-05T09:00:25Z;TP2;4k7;;RES',
].join('\n');

test('a meter log with good and bad rows: preview, bind, import once', async ({ page, shop }) => {
  const setup = await benchSetup(shop);
  const job = await send<{ id: string }>(setup.tech, 'post', '/jobs', {
    customerId: setup.customerId,
    boardId: setup.boardId,
    unitDescription: 'Outdoor unit',
    symptom: 'Fan never starts',
  });

  await signIn(page, shop.users.tech.email);
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto(`/jobs/${job.id}/import`);
  await page.getByLabel('Meter log (CSV)').setInputFiles({ name: 'bench-meter.csv', mimeType: 'text/csv', buffer: Buffer.from(LOG) });
  await page.getByRole('button', { name: 'New meter profile' }).click();
  await page.getByLabel('Meter name').fill(`Bench meter ${setup.tag}`);
  await page.getByLabel('Test point column').selectOption('Point');
  await page.getByLabel('Reading column').selectOption('Reading');
  await page.getByLabel('Unit column (optional)').selectOption('Unit');
  await page.getByLabel('Meter function column (optional)').selectOption('Function');
  await page.getByLabel('Time column (optional)').selectOption('Time');
  await page.getByRole('button', { name: 'Save the meter profile' }).click();
  await expect(page.getByRole('combobox', { name: 'Meter profile' })).not.toHaveValue('');

  await page.getByRole('button', { name: 'Preview bench-meter.csv' }).click();
  const table = page.getByRole('table', { name: 'Rows of the log' });
  await expect(table.getByRole('row').filter({ hasText: 'TP9' })).toContainText('"TP9" is not a test point of this board');
  await expect(table.getByRole('row').filter({ hasText: 'banana' })).toContainText('"banana" is not a reading');
  await expect(table.getByRole('row').filter({ hasText: '4k7' })).toContainText(/power/i);
  await expect(page.getByText('Nothing is stored until you import. 2 rows ready, 4 with a problem.')).toBeVisible();
  expect((await send<{ items: unknown[] }>(setup.tech, 'get', `/jobs/${job.id}/readings`)).items).toHaveLength(0);

  // The row the meter logged without a test point is bound by hand.
  await page.getByLabel('Test point for line 6').selectOption('TP1');
  await page.getByRole('button', { name: 'Import 3 readings, skip 3 rows' }).click();
  await expect(page.getByRole('status')).toContainText('Stored 3 readings (3 rows imported, 3 skipped).');
  const stored = await send<{ items: { red: string; raw: string; instrument: string }[] }>(setup.tech, 'get', `/jobs/${job.id}/readings`);
  expect(stored.items.map((r) => `${r.red} ${r.raw}`).sort()).toEqual(['TP1 14,9 V', 'TP1 15.1 V', 'TP2 7.48']);

  await page.setViewportSize({ width: 390, height: 844 });
  await expect(page.getByRole('status')).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});
