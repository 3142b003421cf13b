import type { CapturedMail, CapturedMailSummary, JobBilling, Quote } from '@splitscope/contract';
import { expect, signIn, test } from './fixtures';
import { getJson, shot } from './helpers';
import { api, createJob } from './support/shop-data';

test.describe('the customer page', () => {
  // The altered link's API call answers 404 on purpose; the browser logs that as a console error.
  test.use({ expectedConsoleErrors: [/404 \(Not Found\)/] });

  test('the link from the e-mail approves the quote; an altered link shows the plain dead-link page', async ({ page, browser }) => {
    await signIn(page, 'tech@demo.test');
    await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
    const job = await createJob(page);
    const quote = await api.send<Quote>(
      page,
      'POST',
      `/jobs/${job.id}/quotes`,
      { lines: [{ kind: 'part', description: 'Fan-drive opto-coupler', quantity: '1', unitCents: 450 }], taxRate: '0' },
      201,
    );
    await api.send(page, 'POST', `/quotes/${quote.id}/send`, {}, 200);

    // The shop admin's outbox holds what the local SMTP capture server received: take the link from there.
    const admin = await browser.newPage();
    await signIn(admin, 'admin@demo.test');
    await expect(admin.getByRole('navigation', { name: 'Main' })).toBeVisible();
    const list = await getJson<{ items: CapturedMailSummary[] }>(admin, '/dev/mail');
    const summary = list.items.find((m) => m.subject.startsWith(`Quote ${quote.number} `));
    expect(summary, `the mail of quote ${quote.number}`).toBeTruthy();
    const mail = await getJson<CapturedMail>(admin, `/dev/mail/${summary!.id}`);
    const token = /\/c\/([A-Za-z0-9_-]{43})\b/.exec(mail.text ?? '')?.[1];
    expect(token, 'a customer link in the text part').toBeTruthy();

    // The customer has no session: a fresh context.
    const ctx = await browser.newContext();
    const customer = await ctx.newPage();
    await customer.goto(`/c/${token}`);
    const card = customer.getByRole('region', { name: `Quote ${quote.number}` });
    await expect(card).toBeVisible();
    await expect(card).toContainText('Fan-drive opto-coupler');
    await shot(customer, 'customer-page-quote');
    await card.getByRole('button', { name: 'Approve the quote' }).click();
    await expect(card.getByText('You approved this quote.')).toBeVisible();
    await shot(customer, 'customer-page-approved');

    // One character changed: the same plain page as an expired link, saying nothing about the job.
    const altered = token!.slice(0, -1) + (token!.endsWith('A') ? 'B' : 'A');
    await customer.goto(`/c/${altered}`);
    await expect(customer.getByRole('heading', { name: 'Link no longer valid' })).toBeVisible();
    await expect(customer.getByText(quote.number)).toHaveCount(0);
    await shot(customer, 'customer-page-dead-link');
    await ctx.close();

    // Back at the shop the answer shows on the job's billing panel.
    const billing = await getJson<JobBilling>(page, `/jobs/${job.id}/billing`);
    expect(billing.quotes.find((q) => q.id === quote.id)?.status).toBe('approved');
    await page.goto(`/jobs/${job.id}/billing`);
    await expect(page.getByRole('article').filter({ has: page.getByRole('heading', { name: `Quote ${quote.number}`, exact: true }) })).toContainText(
      'Approved by the customer',
    );
    await admin.close();
  });
});
