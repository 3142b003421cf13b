// The bench on a tablet-sized laptop (1024×768) and a phone (390×844): at 1024 the map, the reading entry, the
// ranking and the next test share one screen without page scroll; on the phone the current step and the value
// field are on the first screen. Screenshots go to docs/screens/ with the date.
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { apiAs } from './support/divider-job';
import { createJob } from './support/shop-data';

const DATE = new Date().toISOString().slice(0, 10);

test('at 1024×768 the bench fits one screen: map, reading entry, ranking and next test', async ({ page, shop }) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await signIn(page, shop.users.tech.email);
  const job = await createJob(page, { faultCode: 'F7', assigneeId: shop.users.tech.id });
  await page.goto(`/jobs/${job.id}?mode=free`);
  await page.getByRole('tab', { name: 'Test points' }).click();
  await page
    .getByRole('navigation', { name: 'Test points' })
    .getByRole('button', { name: /^TP3 15 V rail/ })
    .click();
  await page.getByRole('tab', { name: 'Board map' }).click();
  await expect(page.getByLabel('Measured value')).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Probable faulty parts' })).toBeVisible({ timeout: 45_000 });
  await expect(page.getByRole('heading', { name: 'Next tests' })).toBeVisible();
  const scroll = await page.evaluate(() => document.documentElement.scrollHeight - window.innerHeight);
  expect(scroll, 'the page itself does not scroll').toBeLessThanOrEqual(1);
  for (const el of [
    page.getByLabel('Measured value'),
    page.getByRole('heading', { name: 'Probable faulty parts' }),
    page.getByTestId('ranking-area').getByRole('button').first(),
  ]) {
    const box = (await el.boundingBox())!;
    expect(box.y + box.height).toBeLessThanOrEqual(768);
  }
  await page.screenshot({ path: `docs/screens/${DATE}-bench-1024x768.png` });
});

test('at 390×844 the current step and the value field are on the first screen', async ({ page, shop }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  // The trainee's job, opened by the shop's technician (a trainee opens none).
  const tech = await apiAs(shop.users.tech.email);
  const job = await createJob(tech, { faultCode: 'F7', assigneeId: shop.users.trainee.id });
  await tech.dispose();
  await signIn(page, shop.users.trainee.email);
  await page.goto(`/jobs/${job.id}`);
  // The first diagnosis of a job takes the engine a few seconds.
  await expect(page.getByTestId('guided-step')).toBeVisible({ timeout: 45_000 });
  const field = page.getByLabel('Measured value').or(page.getByRole('heading', { name: /Safety gate/ }));
  await expect(field.first()).toBeVisible();
  for (const el of [page.getByTestId('guided-step'), field.first()]) {
    const box = (await el.boundingBox())!;
    expect(box.y, 'on the first screen').toBeLessThan(844);
  }
  await page.screenshot({ path: `docs/screens/${DATE}-bench-390x844.png` });
});
