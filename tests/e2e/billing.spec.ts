import type { BillingSettings, CapturedMailSummary } from '@splitscope/contract';
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { getJson, shot } from './helpers';
import { createJob } from './support/shop-data';

// The mail outbox shows each message's HTML in a frame sandboxed without scripts; Chromium reports the browser
// tooling's own script being refused there at times. That refusal is the sandbox working, not a page error.
test.use({ expectedConsoleErrors: [/Blocked script execution in 'about:srcdoc'/] });

test('the shop admin composes a quote in the shop currency, sends it, and the mail outbox shows it', async ({ page, shop }) => {
  await signIn(page, shop.users.admin.email);
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  const job = await createJob(page);
  const settings = await getJson<BillingSettings>(page, '/billing/settings');
  const cur = settings.currency.toUpperCase();

  await page.goto(`/jobs/${job.id}/billing`);
  await expect(page.getByRole('heading', { name: `Billing · job #${job.number}` })).toBeVisible();
  const editor = page.getByRole('form', { name: 'New quote' });
  await expect(editor).toBeVisible();
  await expect(editor.getByText(`Prices in ${cur}`)).toBeVisible();

  await editor.getByLabel('Description (line 1)').fill('Opto-coupler, fan drive');
  await editor.getByLabel(`Unit price (${cur})`).first().fill('4,50');
  await editor.getByRole('button', { name: 'Add labour' }).click();
  await editor.getByLabel('Quantity').nth(1).fill('1.5');
  await editor.getByLabel(`Unit price (${cur})`).nth(1).fill('65');
  await editor.getByLabel('Taxed').nth(1).uncheck();
  await editor.getByLabel('Tax rate (%)').fill('8.25');
  await editor.getByRole('button', { name: 'Save as draft' }).click();
  // A comma is not a decimal point here: the form says so instead of guessing.
  await expect(editor.getByText(/An amount like 12.50/)).toBeVisible();
  await shot(page, 'billing-quote-editor');
  await editor.getByLabel(`Unit price (${cur})`).first().fill('4.50');
  await editor.getByRole('button', { name: 'Save as draft' }).click();

  // The totals are the server's: 4.50 + 1.5 × 65.00 = 102.00; tax 8.25 % of the taxed 4.50 = 0.37125 → 0.37
  // (half away from zero, once per document, as packages/contract/src/billing.ts states).
  const draft = page.getByRole('article').filter({ hasText: 'Draft, not sent' }).first();
  await expect(draft).toBeVisible();
  const number = (await draft.getByRole('heading').textContent())!.replace('Quote ', '').trim();
  const quote = page.getByRole('article').filter({ has: page.getByRole('heading', { name: `Quote ${number}`, exact: true }) });
  await expect(quote.getByRole('row', { name: /Subtotal/ })).toContainText(`${cur} 102.00`);
  await expect(quote.getByRole('row', { name: /Tax \(8.25 %\)/ })).toContainText(`${cur} 0.37`);
  await expect(quote.getByRole('row', { name: /Total/ }).last()).toContainText(`${cur} 102.37`);

  await expect(quote.getByLabel('Customer e-mail')).toHaveValue(job.customer.email!);
  await quote.getByRole('button', { name: 'Send the quote' }).click();
  await expect(quote.getByText(`Sent to ${job.customer.email} at`)).toBeVisible();
  await expect(quote).toContainText('Sent, awaiting the customer');
  await shot(page, 'billing-quote-sent');

  await page.getByRole('link', { name: 'Mail outbox' }).click();
  const subject = new RegExp(`Quote ${number} for job ${job.number}`);
  await page.getByRole('button', { name: subject }).first().click();
  await expect(page.getByRole('heading', { name: subject })).toBeVisible();
  await expect(page.getByText(new RegExp(`/c/[A-Za-z0-9_-]{43}`)).first()).toBeVisible();
  const mails = await getJson<{ items: CapturedMailSummary[] }>(page, '/dev/mail');
  expect(mails.items.some((m) => subject.test(m.subject) && m.to.includes(job.customer.email!))).toBe(true);
  await shot(page, 'billing-outbox');

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing', exact: true }).click();
  await expect(page.getByLabel('Default tax rate (%)')).toHaveValue(settings.taxRate);
  await expect(page.getByRole('group', { name: /status e-mail/ })).toBeVisible();
  await shot(page, 'billing-settings');
});

test('a trainee sees a job’s billing but cannot quote, and the settings page is not theirs', async ({ page, shop }) => {
  // A technician opens the job; the trainee then looks at it.
  await signIn(page, shop.users.tech.email);
  const job = await createJob(page);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();
  await signIn(page, shop.users.trainee.email);
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  await page.goto(`/jobs/${job.id}/billing`);
  await expect(page.getByRole('heading', { name: `Billing · job #${job.number}` })).toBeVisible();
  await expect(page.getByText('a technician, lead or shop admin quotes and invoices')).toBeVisible();
  await expect(page.getByRole('button', { name: 'New quote' })).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'Billing settings' })).toHaveCount(0);
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing', exact: true })).toHaveCount(0);
  await page.goto('/billing/settings');
  await expect(page.getByText('Only a shop admin changes the billing settings.')).toBeVisible();
});
