import { expect, signIn, test } from './fixtures';

test('a technician signs in and out', async ({ page }) => {
  await signIn(page, 'tech@demo.test');
  await expect(page.getByRole('heading', { name: /Welcome, Priya Nair/ })).toBeVisible();
  await expect(page.getByText('Technician · Harbour Lane Board Repair')).toBeVisible();
  await page.screenshot({ path: 'tests/artifacts/sign-in-home.png' });
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();
});

test.describe('refused sign-in', () => {
  test.use({ expectedConsoleErrors: [/status of 401/] });
  test('a wrong password is refused with a plain message', async ({ page }) => {
    await signIn(page, 'tech@demo.test', 'not-the-password');
    await expect(page.getByRole('alert')).toHaveText('E-mail or password is wrong');
  });
});
