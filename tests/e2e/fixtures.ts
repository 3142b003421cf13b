import { expect, test as base, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'splitscope-demo';

/** Any console error in the page fails the test: a quiet console is part of "works". */
export const test = base.extend<{ expectedConsoleErrors: RegExp[]; failOnConsoleError: void }>({
  /** Console errors a test provokes on purpose (e.g. the browser logging a refused sign-in's 401). */
  expectedConsoleErrors: [[], { option: true }],
  failOnConsoleError: [
    async ({ page, expectedConsoleErrors }, use) => {
      const expected = ([] as RegExp[]).concat(expectedConsoleErrors);
      const errors: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error' && !expected.some((re) => re.test(m.text()))) errors.push(m.text());
      });
      page.on('pageerror', (e) => errors.push(e.message));
      await use();
      expect(errors, 'console errors in the page').toEqual([]);
    },
    { auto: true },
  ],
});

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // Signed in once the app has left the sign-in page (argon2 takes a moment on a busy machine); a test that
  // navigates straight away would otherwise race the session cookie.
  // (A test of a refused password stays on the page and checks the message itself.)
  if (password === DEMO_PASSWORD) await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 30_000 });
}

export { expect };
