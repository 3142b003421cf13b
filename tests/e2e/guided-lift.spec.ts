// A lead lifts guided order for a trainee on all of that trainee's jobs, from the bench of any one of them, and
// puts it back. The spec makes its own trainee (an invitation accepted through the API), customer and jobs.
import type { CreatedInvitation, Me } from '@splitscope/contract';
import { DEMO_PASSWORD, expect, signIn, test } from './fixtures';
import { api, createCustomer, createJob, runTag } from './support/shop-data';

test('a lead lifts guided order on all of a trainee’s jobs, and holds the trainee to it again', async ({ page, browser }) => {
  // Three people sign in (argon2 each) and three benches load: about 30 s on a quiet machine, 85 s on a busy one.
  test.setTimeout(120_000);
  // The admin only invites (through the API); the lead works in the browser. Both sign in at once.
  const admin = await browser.newPage();
  await Promise.all([signIn(page, 'lead@demo.test'), admin.request.post('/api/auth/sign-in', { data: { email: 'admin@demo.test', password: DEMO_PASSWORD } })]);
  const tag = runTag();
  const name = `Robin ${tag.slice(0, 6)}`;
  const invite = await api.send<CreatedInvitation>(admin, 'POST', '/users/invitations', { name, email: `robin-${tag}@example.test`, role: 'trainee' }, 201);
  const traineePage = await browser.newPage();
  await api.send(traineePage, 'POST', '/auth/accept-invitation', { token: invite.token, password: 'guided-lift-trainee-1' }, 204);
  const traineeId = (await api.get<Me>(traineePage, '/me')).id;
  const customer = await createCustomer(page);
  const job = (symptom: string) => createJob(page, { customerId: customer.id, faultCode: 'F7', symptom, assigneeId: traineeId });
  const [a, b] = [await job('Fan stops after a minute'), await job('Fan never starts')];

  // Bound to start with, on both jobs.
  await traineePage.goto(`/jobs/${b.id}`);
  await expect(traineePage.getByTestId('guided-locked')).toContainText('Guided order: on', { timeout: 20_000 });

  await page.goto(`/jobs/${a.id}`);
  const control = page.getByTestId('trainee-guided');
  await expect(control).toContainText(`${name}: guided order on`, { timeout: 20_000 });
  // Before the first reading the ranking names what the fault code points at, by section, and the first test.
  const before = page.getByTestId('before-first-reading');
  await expect(before).toContainText('Fault code F7');
  await expect(before).toContainText('Fan supply switch');
  await expect(before).toContainText(/First test: Put the red probe on/, { timeout: 20_000 });
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
