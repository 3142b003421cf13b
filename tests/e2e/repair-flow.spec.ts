import type { BoardModel, Diagnosis, FaultCodeList, JobDetail } from '@splitscope/contract';
import { expect, signIn, test } from './fixtures';
import { findJob, getJson, shot, typed } from './helpers';
import { faultedBoard } from './simulated-fault';
// A test may reach into the contract's source; the root package does not depend on the workspace packages.
import { verificationChecklist } from '../../packages/contract/src/index';

// The demo job's board has a shorted ceramic filter capacitor on the switched fan rail (C9, 0.3 ohm): the
// lesson of the trade that a shorted capacitor kills a rail while every transistor tests fine.
const FAULT = { component: 'C9', mode: 'short', value: 0.3 };

test('tech diagnoses on the map, lead approves, tech repairs and verifies, the report shows it all', async ({ page, context }) => {
  test.setTimeout(300_000);
  await signIn(page, 'tech@demo.test');
  await expect(page.getByRole('heading', { name: 'My open jobs' })).toBeVisible();
  const job = await findJob(page, ['received', 'diagnosing'], '&assignee=me');
  const doc = job.board.document as unknown as BoardModel;
  const codes = await getJson<FaultCodeList>(page, `/fault-codes?boardId=${job.boardId}`);
  const suspect = new Set(codes.items.find((c) => c.code === job.faultCode)?.sections ?? []);
  expect(suspect.size, 'the demo job has a fault code that names suspect sections').toBeGreaterThan(0);
  const partSection = (part: string) => doc.parts.find((p) => p.designator === part || p.element === part)?.section;
  const board = faultedBoard(job, FAULT);

  await page.goto(`/jobs/${job.id}?mode=free`);
  // The first diagnosis of a board version builds its model: seconds on a busy machine.
  await expect(page.getByRole('heading', { name: 'Next tests' })).toBeVisible({ timeout: 60_000 });

  // Take the engine's first next test each time, typing what the faulted board reads, until one part leads.
  let d = await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`);
  let gates = 0;
  for (let i = 0; i < 14 && !(d.parts[0] && d.parts[0].probability >= 0.8); i++) {
    const step = d.nextTests[0];
    expect(step, 'the engine proposes a next test').toBeTruthy();
    await page.getByRole('heading', { name: 'Next tests' }).locator('..').getByRole('button').first().click();
    if (step!.power === 'off' && (await page.getByRole('heading', { name: /Safety gate/ }).isVisible())) {
      // Unpowered on the hot side: the gate stands before the value field until the bus is measured safe.
      await expect(page.getByLabel('Measured value')).toHaveCount(0);
      await page.getByLabel(/The board is unplugged/).check();
      await page.getByLabel(/Bus voltage I measured now/).fill('1.4');
      await page.getByRole('button', { name: 'Bus is safe — continue' }).click();
      if (gates++ === 0) await shot(page, 'flow-safety-gate');
    }
    await page.getByLabel('Measured value').fill(board(step!));
    await page.getByLabel('Measured value').press('Enter');
    await expect(page.getByTestId('verdict')).toBeVisible();
    // A new reading can need new fault simulations on the server: allow for a busy 2-core machine.
    await expect
      .poll(async () => (await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`)).readings.length, { timeout: 60_000 })
      .toBe(d.readings.length + 1);
    d = await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`);
  }
  expect(gates, 'the flow passed the safety gate before its unpowered steps').toBeGreaterThan(0);
  const top = d.parts[0]!;
  expect(top.part, 'the ranking names the failed part').toBe(FAULT.component);
  expect(top.probability).toBeGreaterThanOrEqual(0.8);
  expect(suspect.has(partSection(top.part) ?? ''), `${top.part} sits in a suspect section`).toBe(true);
  await expect(page.getByRole('heading', { name: 'Probable faulty parts' }).locator('..').getByRole('listitem').first()).toContainText(top.part);
  await page.getByRole('heading', { name: 'Probable faulty parts' }).locator('..').getByRole('button').first().click();
  await shot(page, 'flow-ranking');
  await page.getByRole('button', { name: `Propose ${top.part} for review` }).click();
  await expect(page.getByText(`Proposed ${top.part}: waiting for a lead’s review.`)).toBeVisible();

  // The lead approves.
  const lead = await context.browser()!.newPage();
  await signIn(lead, 'lead@demo.test');
  await expect(lead.getByRole('heading', { name: 'Review queue' })).toBeVisible();
  await lead.goto(`/jobs/${job.id}/review`);
  await expect(lead.getByTestId('proposed-part')).toHaveText(top.part);
  await shot(lead, 'flow-review');
  await lead.getByRole('button', { name: `Approve ${top.part}` }).click();
  await lead.getByRole('button', { name: `Yes, approve: replace ${top.part}` }).click();
  await expect(lead).toHaveURL(/\/review$/);

  // The tech records the repair and healthy verification readings.
  await page.goto(`/jobs/${job.id}/repair`);
  await page.getByLabel('Part (designator)').fill(top.part);
  await page.getByLabel('Replacement value').fill('new part, same value');
  await page.getByRole('button', { name: 'Save the repair' }).click();
  // Verification is the short checklist the sign-off checks (contract: verificationChecklist), in its order.
  const checklist = page.getByRole('heading', { name: /Verification checklist/ }).locator('..');
  await expect(checklist).toBeVisible();
  const repaired = await getJson<JobDetail>(page, `/jobs/${job.id}`);
  const { rows } = verificationChecklist(repaired.board.document as unknown as BoardModel, repaired.board.expectedReadings, repaired.proposedPart);
  expect(rows.length).toBeGreaterThan(0);
  for (const [i, row] of rows.entries()) {
    const item = checklist.getByRole('listitem').nth(i);
    const field = item.getByRole('textbox');
    const value = row.mode === 'continuity' ? (row.expected ? 'beep' : 'no beep') : typed(row.expected as number | 'OL');
    await field.fill(value);
    await field.press('Enter');
    const gate = page.getByRole('heading', { name: /Safety gate/ });
    await expect(gate.or(item.getByText('healthy')).first()).toBeVisible({ timeout: 30_000 });
    if (await gate.isVisible()) {
      await page.getByLabel(/The board is unplugged/).check();
      await page.getByLabel(/Bus voltage I measured now/).fill('1.2');
      await page.getByRole('button', { name: 'Bus is safe — continue' }).click();
      await field.fill(value);
      await field.press('Enter');
    }
    await expect(item.getByTestId('check-result')).toContainText('healthy', { timeout: 30_000 });
  }
  await shot(page, 'flow-verification');

  // The lead signs it off; the report shows the fault, the readings, the part and the verification.
  await lead.goto(`/jobs/${job.id}/repair`);
  await lead.getByLabel(/Functional check:/).check();
  await lead.getByRole('button', { name: 'Sign off: board verified' }).click();
  await expect(lead.getByText('Verified', { exact: true })).toBeVisible();
  await page.goto(`/jobs/${job.id}/report`);
  await expect(page.getByTestId('report-part')).toContainText(top.part);
  await expect(page.getByTestId('report-repairs')).toContainText(top.part);
  await expect(page.getByText('The board was verified against its expected readings.')).toBeVisible();
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print or save as PDF' })).toBeHidden();
  await shot(page, 'flow-report-print');
});
