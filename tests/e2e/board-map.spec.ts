import type { BoardModel } from '@splitscope/contract';
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { shot } from './helpers';
import { createJob } from './support/shop-data';

// The test-point list is under its own "Test points" tab beside the map: the keyboard walk opens that tab.
test('the board map pans, zooms and selects points by mouse and by keyboard', async ({ page, shop }) => {
  // Some twenty gestures, each waiting for the canvas to redraw: slower than a minute on a loaded machine.
  test.setTimeout(120_000);
  await signIn(page, shop.users.tech.email);
  await expect(page.getByRole('heading', { name: /Welcome/ })).toBeVisible();
  const job = await createJob(page, { symptom: 'Map walk: fan never starts' });
  const doc = job.board.document as unknown as BoardModel;
  await page.goto(`/jobs/${job.id}?mode=free`);
  const map = page.getByTestId('board-map');
  await expect(map.locator('canvas').first()).toBeVisible({ timeout: 20_000 });
  const scale = async () => Number(await map.getAttribute('data-scale'));
  const offset = async () => (await map.getAttribute('data-offset'))!;
  const fitted = await scale();

  // keyboard: + zooms in, arrows pan, 0 fits again
  await map.focus();
  await page.keyboard.press('+');
  await expect.poll(scale).toBeGreaterThan(fitted);
  const before = await offset();
  await page.keyboard.press('ArrowLeft');
  await expect.poll(offset).not.toBe(before);
  await page.keyboard.press('0');
  await expect.poll(scale).toBeCloseTo(fitted, 3);

  // mouse: wheel zooms about the pointer, dragging pans
  const box = (await map.boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.wheel(0, -300);
  await expect.poll(scale).toBeGreaterThan(fitted);
  await page.keyboard.press('0');
  await map.focus();
  await page.keyboard.press('0');
  const o1 = await offset();
  await page.mouse.move(box.x + 30, box.y + 30);
  await page.mouse.down();
  await page.mouse.move(box.x + 130, box.y + 90, { steps: 8 });
  await page.mouse.up();
  await expect.poll(offset).not.toBe(o1);

  // mouse: clicking a marker opens the reading panel for it
  await map.focus();
  await page.keyboard.press('0');
  const tp = doc.testPoints[0]!;
  const s = await scale();
  const [ox, oy] = (await offset()).split(',').map(Number) as [number, number];
  await page.mouse.click(box.x + tp.x * s + ox, box.y + tp.y * s + oy);
  await expect(page.getByRole('heading', { name: new RegExp(` at ${tp.id}\\b`) })).toBeVisible();

  // keyboard: the test-point list, under its own tab, is the accessible way to pick a point
  const tab = page.getByRole('tab', { name: 'Test points' });
  await tab.focus();
  await page.keyboard.press('Enter');
  await expect(tab).toHaveAttribute('aria-selected', 'true');
  const other = doc.testPoints[1]!;
  const item = page.getByRole('navigation', { name: 'Test points' }).getByRole('button', { name: new RegExp(`^${other.id}\\b`) });
  await item.focus();
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { name: new RegExp(` at ${other.id}\\b`) })).toBeVisible();
  await expect(page.getByLabel('Measured value')).toBeFocused();
  await shot(page, 'bench-map');
});
