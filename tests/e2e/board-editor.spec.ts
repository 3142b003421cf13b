import { signIn } from './fixtures';
import { shot } from './helpers';
import { expect, test } from './support/own-shop';

// The indoor demo board (the spec shop's copy) is composed from section templates: change the mains voltage of its
// DC bus section, compose again in the browser, save, and the server's recomputed expected table follows.
test('an admin composes a board again from its section templates and the expected bus reading follows', async ({ page, shop }) => {
  test.setTimeout(180_000);
  await signIn(page, shop.users.admin.email);
  await page.goto(`/boards/${shop.boards.indoorFan}`);
  // The editor's first load draws the map and the drawing of the composition: slow on a busy machine.
  await expect(page.getByRole('heading', { name: 'Compose from section templates' })).toBeVisible({ timeout: 30_000 });
  const busRow = page.getByRole('row', { name: /DC bus \+.*DC V.*on/ }).first();
  const before = await busRow.textContent();
  await page.getByLabel('mainsRms').fill('120');
  await page.getByLabel('mainsRms').blur();
  await page.getByRole('button', { name: 'Compose the board again' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Composed' })).toBeVisible({ timeout: 30_000 });
  await page.getByLabel('Note for this version').fill('mains 120 V variant');
  await page.getByRole('button', { name: 'Save as a new version' }).click();
  await expect(page.getByText(/^Saved:/)).toBeVisible({ timeout: 90_000 });
  await expect(busRow).not.toHaveText(before!);
  // About √2 × 120 V less two bridge diode drops: the engine's figure, within the band the row shows.
  await expect(busRow).toContainText(/1[5-7]\d(\.\d)? V/);
  await shot(page, 'board-editor-composed');
});
