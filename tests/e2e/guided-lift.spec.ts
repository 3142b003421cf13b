// A lead lifts guided order for a trainee on all of that trainee's jobs, from the bench of any one of them, and
// puts it back. The spec makes its own trainee (an invitation accepted through the API), customer and jobs.
import { randomUUID } from 'node:crypto';
import type { Me } from '@splitscope/contract';
import type { Page } from '@playwright/test';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';
import { getJson } from './helpers';

/** POSTs to the API with the page's cookies (a session the answer sets is the page's too). */
async function post(page: Page, path: string, body: unknown) {
  const r = await page.request.post(`/api${path}`, { data: body });
  const text = await r.text();
  expect(r.status(), `${path}: ${text}`).toBeLessThan(300);
  return (text ? JSON.parse(text) : {}) as Record<string, string>;
}

test('a lead lifts guided order on all of a trainee’s jobs, and holds the trainee to it again', async ({ page, browser }) => {
  // Three people sign in (argon2 each) and three benches load: about 30 s on a quiet machine, 85 s on a busy one.
  test.setTimeout(120_000);
  // The admin only invites (through the API); the lead works in the browser. Both sign in at once.
  const admin = await browser.newPage();
  await Promise.all([signIn(page, 'lead@demo.test'), admin.request.post('/api/auth/sign-in', { data: { email: 'admin@demo.test', password: DEMO_PASSWORD } })]);
  const name = `Robin ${randomUUID().slice(0, 6)}`;
  const invite = await post(admin, '/users/invitations', { name, email: `robin-${randomUUID()}@example.test`, role: 'trainee' });
  const traineePage = await browser.newPage();
  await post(traineePage, '/auth/accept-invitation', { token: invite.token, password: 'guided-lift-trainee-1' });
  const traineeId = (await getJson<Me>(traineePage, '/me')).id;
  const customer = await post(page, '/customers', { name: `Lift Check Cooling ${randomUUID().slice(0, 6)}`, kind: 'contractor' });
  const job = (symptom: string) =>
    post(page, '/jobs', { customerId: customer.id, boardId: 'board-demo-ofd-220', unitDescription: 'Outdoor unit', faultCode: 'F7', symptom, assigneeId: traineeId });
  const [a, b] = [await job('Fan stops after a minute'), await job('Fan never starts')];

  // Bound to start with, on both jobs.
  await traineePage.goto(`/jobs/${b.id}`);
  await expect(traineePage.getByTestId('guided-locked')).toContainText('Guided order: on', { timeout: 20_000 });

  await page.goto(`/jobs/${a.id}`);
  const control = page.getByTestId('trainee-guided');
  await expect(control).toContainText(`${name}: guided order on`, { timeout: 20_000 });
  await control.locator('summary').click();
  await control.getByRole('button', { name: `Lift guided order on all of ${name}’s jobs` }).click();
  await expect(control).toContainText(`${name}: guided order lifted`);

  // The other job, never lifted on its own, is free for the trainee now.
  await traineePage.reload();
  await expect(traineePage.getByRole('button', { name: /Guided order: on/ })).toBeVisible({ timeout: 20_000 });
  await expect(traineePage.getByTestId('guided-locked')).toHaveCount(0);

  await control.getByRole('button', { name: `Hold ${name} to guided order on all jobs` }).click();
  await expect(control).toContainText(`${name}: guided order on`);
  await traineePage.reload();
  await expect(traineePage.getByTestId('guided-locked')).toContainText('Guided order: on', { timeout: 20_000 });
  await Promise.all([admin.close(), traineePage.close()]);
});
