import type { BoardModel, Diagnosis, FaultCodeList, JobDetail } from '@splitscope/contract';
import { expect, signIn, test } from './fixtures';
import { expectedRowFor, findJob, getJson, shot, typed } from './helpers';

// Waits on the tech's path through the safety gate: since every point of the demo board is on the hot side,
// the unpowered steps now ask for the bus check first, which this flow does not do yet.
test.fixme('tech diagnoses on the map, lead approves, tech repairs and verifies, the report shows it all', async ({ page, context }) => {
  test.setTimeout(180_000);
  await signIn(page, 'tech@demo.test');
  await expect(page.getByRole('heading', { name: 'My open jobs' })).toBeVisible();
  const job = await findJob(page, ['received', 'diagnosing'], '&assignee=me');
  const doc = job.board.document as unknown as BoardModel;
  const codes = await getJson<FaultCodeList>(page, `/fault-codes?boardId=${job.boardId}`);
  const suspect = new Set(codes.items.find((c) => c.code === job.faultCode)?.sections ?? []);
  expect(suspect.size, 'the demo job has a fault code that names suspect sections').toBeGreaterThan(0);
  const sectionOf = (probe: string) => doc.testPoints.find((t) => t.id === probe || t.net === probe)?.section;
  const partSection = (part: string) => doc.parts.find((p) => p.designator === part || p.element === part)?.section;

  await page.goto(`/jobs/${job.id}?mode=free`);
  await expect(page.getByRole('heading', { name: 'Next tests' })).toBeVisible();

  // The simulated failure: the suspect section reads dead (0 V, open), everything upstream reads healthy.
  let d = await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`);
  for (let i = 0; i < 14 && !(d.parts[0] && d.parts[0].probability >= 0.5); i++) {
    const step = d.nextTests[0];
    expect(step, 'the engine proposes a next test').toBeTruthy();
    const row = expectedRowFor(job, step!);
    expect(row, 'the next test is in the expected table').toBeTruthy();
    const dead = suspect.has(sectionOf(step!.red) ?? '');
    const value = dead ? (step!.mode === 'dcv' ? '0' : 'OL') : typed(row!.expected);
    await page.getByRole('heading', { name: 'Next tests' }).locator('..').getByRole('button').first().click();
    await page.getByLabel('Measured value').fill(value);
    await page.getByLabel('Measured value').press('Enter');
    await expect(page.getByTestId('verdict')).toBeVisible();
    await expect.poll(async () => (await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`)).readings.length).toBe(d.readings.length + 1);
    d = await getJson<Diagnosis>(page, `/jobs/${job.id}/diagnosis`);
  }
  const top = d.parts[0]!;
  expect(top.probability).toBeGreaterThanOrEqual(0.5);
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
  await expect(lead).toHaveURL(/\/review$/);

  // The tech records the repair and healthy verification readings.
  await page.goto(`/jobs/${job.id}/repair`);
  await page.getByLabel('Part (designator)').fill(top.part);
  await page.getByLabel('Replacement value').fill('new part, same value');
  await page.getByRole('button', { name: 'Save the repair' }).click();
  await expect(page.getByRole('heading', { name: /Verification readings/ })).toBeVisible();
  const repaired = await getJson<JobDetail>(page, `/jobs/${job.id}`);
  const powered = repaired.board.expectedReadings.filter((r) => r.power === 'on' && r.mode === 'dcv' && typeof r.expected === 'number').slice(0, 4);
  for (const r of powered) {
    const field = page.getByLabel(`Verification reading for ${r.label ?? `${r.red} → ${r.black}`}`);
    await field.fill(typed(r.expected));
    await field.press('Enter');
    await expect(field.locator('xpath=ancestor::tr')).toContainText('healthy');
  }
  await shot(page, 'flow-verification');

  // The lead signs it off; the report shows the fault, the readings, the part and the verification.
  await lead.goto(`/jobs/${job.id}/repair`);
  await lead.getByRole('button', { name: 'Mark the board verified' }).click();
  await expect(lead.getByText('Verified', { exact: true })).toBeVisible();
  await page.goto(`/jobs/${job.id}/report`);
  await expect(page.getByTestId('report-part')).toContainText(top.part);
  await expect(page.getByTestId('report-repairs')).toContainText(top.part);
  await expect(page.getByText('The board was verified against its expected readings.')).toBeVisible();
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print or save as PDF' })).toBeHidden();
  await shot(page, 'flow-report-print');
});
