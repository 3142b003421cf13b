// A real shop from an empty database (a server in shop mode, SHOP_BASE_URL): first-run page → shop and admin →
// invite a technician → they choose a password from the e-mail → sign in → the admin deactivates them → their
// session ends.
import type { Browser, Page } from '@playwright/test';
import { expect, test } from './fixtures';

const ADMIN = { name: 'Maren Holt', email: 'maren@northbench.test', password: 'kiln-yard-bench-7' };
const TECH = { name: 'Noor Vance', email: 'noor@northbench.test', password: 'copper-trace-bench-9' };

/** The invitation link from the mail the local capture server received, read through the admin's outbox. */
async function invitationLink(page: Page, to: string): Promise<string> {
  let link = '';
  await expect(async () => {
    const list = (await (await page.request.get('/api/dev/mail')).json()) as { items: { id: string; to: string[] }[] };
    const msg = list.items.find((m) => m.to.some((t) => t.includes(to)));
    expect(msg, `a mail to ${to}`).toBeTruthy();
    const full = (await (await page.request.get(`/api/dev/mail/${msg!.id}`)).json()) as { text: string; from: string };
    expect(full.from).toContain('North Bench Electronics');
    link = /https?:\/\/\S+\/invitation\/[A-Za-z0-9_-]+/.exec(full.text)?.[0] ?? '';
    expect(link).not.toBe('');
  }).toPass({ timeout: 15_000 });
  return new URL(link).pathname;
}

async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext();
  return context.newPage();
}

test('first run, invitation by e-mail, sign-in, deactivation', async ({ page, browser }) => {
  // 1. No shop yet: every way in leads to the first-run page; no demo banner in shop mode.
  await page.goto('/');
  await expect(page).toHaveURL(/\/first-run$/);
  await expect(page.getByText('Demo shop — invented data')).toHaveCount(0);
  await page.getByLabel('Shop name').fill('North Bench Electronics');
  await page.getByLabel('Address').fill('4 Kiln Yard, Eastport');
  await page.getByLabel('Phone').fill('555-0100');
  await page.getByLabel('Shop e-mail').fill('desk@northbench.test');
  await page.getByLabel('Currency').fill('EUR');
  await page.getByLabel('Tax number (optional)').fill('TX-0042');
  await page.getByLabel('Your name').fill(ADMIN.name);
  await page.getByLabel('Your e-mail').fill(ADMIN.email);
  await page.getByLabel('Password').fill(ADMIN.password);
  await page.getByRole('button', { name: 'Create the shop and sign in' }).click();

  // 2. The admin lands on People, signed in, and invites a technician.
  await expect(page.getByRole('heading', { name: 'People' })).toBeVisible({ timeout: 15_000 });
  await expect(page.getByRole('link', { name: /Shop admin/ })).toBeVisible();
  const invite = page.getByRole('form', { name: 'Invite a person' });
  await invite.getByLabel('Name').fill(TECH.name);
  await invite.getByLabel('E-mail').fill(TECH.email);
  await invite.getByLabel('Role').selectOption('tech');
  await invite.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation e-mailed to ${TECH.email}.`)).toBeVisible();
  // The first-run page is closed now.
  expect((await page.request.get('/api/setup')).ok()).toBe(true);
  expect(await (await page.request.get('/api/setup')).json()).toEqual({ mode: 'shop', needsSetup: false });

  // 3. The technician opens the link from the e-mail in their own browser and chooses a password.
  const path = await invitationLink(page, TECH.email);
  const tech = await newPage(browser);
  await tech.goto(path);
  await tech.getByLabel('New password').fill(TECH.password);
  await tech.getByLabel('The same password again').fill(TECH.password);
  await tech.getByRole('button', { name: 'Set my password and sign in' }).click();
  await expect(tech.getByRole('link', { name: /Technician/ })).toBeVisible({ timeout: 15_000 });

  // 4. They sign out and sign in again with that password.
  await tech.getByRole('button', { name: 'Sign out' }).click();
  await expect(tech).toHaveURL(/\/sign-in$/);
  await tech.getByLabel('E-mail').fill(TECH.email);
  await tech.getByLabel('Password').fill(TECH.password);
  await tech.getByRole('button', { name: 'Sign in' }).click();
  await expect(tech.getByRole('link', { name: /Technician/ })).toBeVisible({ timeout: 15_000 });

  // 5. The admin deactivates them: their open session ends at the next request.
  await page.reload();
  await page.getByRole('button', { name: `Deactivate ${TECH.name}` }).click();
  await expect(page.getByRole('button', { name: `Reactivate ${TECH.name}` })).toBeVisible();
  await tech.goto('/jobs');
  await expect(tech).toHaveURL(/\/sign-in$/);
  await tech.getByLabel('E-mail').fill(TECH.email);
  await tech.getByLabel('Password').fill(TECH.password);
  await tech.getByRole('button', { name: 'Sign in' }).click();
  await expect(tech.getByRole('alert')).toContainText('deactivated');
  await tech.context().close();
});
