import type { Diagnosis } from '@splitscope/contract';
import { expect, signIn, test } from './fixtures';
import { expectedRowFor, fetchInPage, findJob, getJson, shot, typed } from './helpers';

test.describe('trainee', () => {
  test.use({ expectedConsoleErrors: [/status of 403/] });

  test('follows the guided order, is stopped by the safety gate, and cannot approve', async ({ page }) => {
    await signIn(page, 'trainee@demo.test');
    await expect(page.getByRole('heading', { name: 'My assigned steps' })).toBeVisible();
    await shot(page, 'trainee-home');
    const job = await findJob(page, ['received', 'diagnosing'], '&assignee=me');
    await page.goto(`/jobs/${job.id}`);
    // Guided order is the trainee's only mode: no switch to turn it off, and asking for the free bench changes nothing.
    await expect(page.getByTestId('guided-locked')).toContainText('Guided order: on');
    await expect(page.getByRole('button', { name: /Guided order/ })).toHaveCount(0);
    await page.goto(`/jobs/${job.id}?mode=free`);
    await expect(page.getByTestId('guided-step')).toBeVisible();
    await expect(page.getByRole('button', { name: /Lift a part|Guided order: off/ })).toHaveCount(0);

    // Powered steps first: answer each with the healthy value until the engine asks for an unpowered one.
    let gated = false;
    for (let i = 0; i < 12 && !gated; i++) {
      await expect(page.getByTestId('guided-step')).toBeVisible();
      const d = await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`);
      const step = d.nextTests[0];
      expect(step, 'the engine suggests a next test').toBeTruthy();
      if (step!.power === 'off') {
        gated = true;
        break;
      }
      await expect(page.getByText('High voltage: this step is taken with the board powered')).toBeVisible();
      const row = expectedRowFor(job, step!);
      expect(row, 'the step is in the expected table').toBeTruthy();
      const count = d.readings.length;
      await page.getByLabel('Measured value').fill(typed(row!.expected));
      await page.getByLabel('Measured value').press('Enter');
      await expect.poll(async () => (await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`)).readings.length).toBeGreaterThan(count);
      await expect(page.getByText(`Steps done (${count + 1})`)).toBeVisible();
    }
    expect(gated, 'the guided order reaches an unpowered step').toBe(true);

    // The gate stands before the unpowered step: no value field until it is passed.
    await expect(page.getByRole('heading', { name: /Safety gate/ })).toBeVisible();
    await expect(page.getByTestId('bleed-time')).not.toBeEmpty();
    await expect(page.getByLabel('Measured value')).toHaveCount(0);
    await shot(page, 'trainee-gate');
    await page.getByRole('button', { name: 'Bus is safe — continue' }).click();
    await expect(page.getByRole('alert')).toContainText('unplugged');
    await page.getByLabel(/The board is unplugged/).check();
    await page.getByLabel(/Bus voltage I measured now/).fill('150');
    await page.getByRole('button', { name: 'Bus is safe — continue' }).click();
    await expect(page.getByRole('alert')).toContainText('not below 60 V');
    // Probes the wrong way round: the magnitude counts, and the screen says what happened.
    await page.getByLabel(/Bus voltage I measured now/).fill('-120');
    await page.getByRole('button', { name: 'Bus is safe — continue' }).click();
    await expect(page.getByRole('alert')).toContainText('Probes reversed? The bus reads −120 V');
    await expect(page.getByLabel('Measured value')).toHaveCount(0);
    await expect(page.getByLabel('Measured value')).toHaveCount(0);
    await page.getByLabel(/Bus voltage I measured now/).fill('2.1');
    await page.getByRole('button', { name: 'Bus is safe — continue' }).click();
    await expect(page.getByLabel('Measured value')).toBeVisible();
    await shot(page, 'trainee-unpowered-step');

    // No approve control on the review screen, and the API refuses a review from a trainee.
    await page.goto(`/jobs/${job.id}/review`);
    await expect(page.getByRole('heading', { name: /Review job/ })).toBeVisible();
    await expect(page.getByRole('button', { name: /Approve/ })).toHaveCount(0);
    const r = await fetchInPage(page, `/jobs/${job.id}/reviews`, { method: 'POST', body: { decision: 'approve', comment: '' } });
    expect(r.status).toBe(403);
  });
});
