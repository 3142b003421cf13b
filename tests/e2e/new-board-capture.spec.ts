import type { JobDetail } from '@splitscope/contract';
import { expect, signIn, test } from './fixtures';
import { fetchInPage, getJson, shot } from './helpers';
import { boardPhoto } from './photo';
import { createCustomer } from './support/shop-data';

// A board the library does not hold, from intake to a judged second job: a new user opens a job on it with a
// 4 MB photo, marks six test points and three sections from templates (values typed from the part markings),
// saves the draft and sees the computed expected values on the points, publishes, records a known-good board
// (its measured band shown beside the computed one), and a second job on the board gets verdicts and a ranking. The spec makes its own customer and jobs.
test('a board not in the library: photo, six points, three template sections, a draft, a model, a judged second job', async ({ page }) => {
  test.setTimeout(150_000);
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, 'lead@demo.test');
  const suffix = Date.now().toString(36);
  const customerId = (await createCustomer(page)).id;

  // Intake: board not in the library yet, maker/model as printed, a 4 MB photo.
  const photo = boardPhoto();
  expect(photo.length).toBeGreaterThan(4_000_000);
  await page.goto('/jobs/new');
  await page.getByLabel('Customer').selectOption(customerId);
  await page.getByRole('combobox', { name: /^Board model/ }).selectOption('unlisted-board');
  await page.getByLabel('Maker (as printed on the board)').fill('Invented Works');
  await page.getByLabel('Model (as printed on the board)').fill(`IW-${suffix}`);
  await page.getByLabel('Unit (make-free description, model line)').fill('Wall unit, indoor');
  await page.getByLabel('Symptom').fill('Indoor fan never starts');
  await page.getByLabel('Photos of the board as received (PNG or JPEG)').setInputFiles({ name: 'board.png', mimeType: 'image/png', buffer: photo });
  await page.getByRole('button', { name: 'Open the job' }).click();
  // The intake form's own address (/jobs/new) matches a job's too: wait for the job's.
  await page.waitForURL((u) => /^\/jobs\/[^/]+$/.test(u.pathname) && !u.pathname.endsWith('/new'), { timeout: 60_000 });
  const firstJobId = page.url().split('/').pop()!;
  await expect(page.getByText('No model for this board yet: readings are recorded, not judged.')).toBeVisible({ timeout: 30_000 });

  // Capture: three sections from templates, values typed from the markings.
  await page.getByRole('link', { name: 'Mark test points and sections on the photo' }).click();
  await expect(page.getByRole('heading', { name: 'Mark the board on its photo' })).toBeVisible();
  const stage = page.getByTestId('capture-photo').locator('canvas').first();
  await expect(stage).toBeVisible();
  const box = (await stage.boundingBox())!;
  const at = (fx: number, fy: number) => ({ x: box.x + fx * box.width, y: box.y + fy * box.height });
  const drag = async (from: [number, number], to: [number, number]) => {
    const a = at(...from),
      b = at(...to);
    await page.mouse.move(a.x, a.y);
    await page.mouse.down();
    await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2);
    await page.mouse.move(b.x, b.y);
    await page.mouse.up();
  };
  await page.getByRole('button', { name: 'Mark section (drag)' }).click();
  const template = page.getByLabel('Section template');
  await template.selectOption('dc-bus');
  await drag([0.02, 0.03], [0.4, 0.4]);
  await template.selectOption('regulator-15v');
  await drag([0.45, 0.03], [0.95, 0.4]);
  await template.selectOption('fan-switch');
  await drag([0.02, 0.5], [0.6, 0.95]);
  const typeMarking = async (designator: string, marking: string, decoded: RegExp) => {
    const field = page.getByLabel(designator, { exact: true });
    await field.fill(marking);
    await field.blur();
    await expect(field.locator('xpath=../span[2]')).toContainText(decoded);
  };
  await typeMarking('C101', '470µF 400V', /470 µF 400 V/);
  await typeMarking('R101', 'brown green yellow gold', /150 kΩ/);
  await typeMarking('C202', '334', /330 nF/);
  await typeMarking('R301', 'orange orange brown gold', /330 Ω/);
  await typeMarking('R303', '103', /10 kΩ/);
  await typeMarking('C301', '104', /100 nF/);
  // Sections meet on the nets they name: the switch takes the regulator's 15 V rail.
  await page.getByLabel('Net: 15 V in').fill('v15');

  // Six test points, then the nets they sit on.
  await page.getByRole('button', { name: 'Place test point' }).click();
  const spots: [number, number][] = [
    [0.1, 0.2],
    [0.3, 0.3],
    [0.55, 0.2],
    [0.8, 0.25],
    [0.2, 0.7],
    [0.4, 0.8],
  ];
  for (const s of spots) {
    const p = at(...s);
    await page.mouse.click(p.x, p.y);
  }
  await expect(page.getByRole('heading', { name: 'Test points (6)' })).toBeVisible();
  await page.getByRole('button', { name: 'Save draft' }).click();
  await expect(page.getByText(/Draft saved .*expected values computed/)).toBeVisible({ timeout: 60_000 });
  const nets = ['vbus', 'bus_mid', 'reg15_vin', 'v15', 'v15sw', 'fan-switch_b'];
  for (const [i, net] of nets.entries())
    await page
      .getByTestId(`point-TP${i + 1}`)
      .getByLabel('Net')
      .fill(net);
  await page.getByTestId('point-TP4').getByLabel('Label').fill('15 V rail');
  await page.getByRole('button', { name: 'Save draft' }).click();
  await expect(page.getByText(/Draft saved .*expected values computed/)).toBeVisible({ timeout: 60_000 });
  for (let i = 1; i <= 6; i++) await expect(page.getByRole('list', { name: `Expected at TP${i}` })).toContainText('DC V, powered');
  // 15 V rail: the MC7815C output band, with its source beside it (onsemi MC7800 series datasheet).
  await expect(page.getByRole('list', { name: 'Expected at TP4' })).toContainText(/DC V, powered: 1[45](\.\d+)? V.*MC7800/);
  await shot(page, 'capture-draft');

  await page.getByRole('button', { name: 'Publish as a new version' }).click();
  await expect(page.getByText('Published as version 2.')).toBeVisible({ timeout: 30_000 });
  const first = await getJson<JobDetail>(page, `/jobs/${firstJobId}`);

  // A second job on the board is judged against the published model; its first ranking (seconds of the engine's
  // time) is asked for now and computed while the known-good board is recorded.
  const second = await fetchInPage(page, '/jobs', {
    method: 'POST',
    body: { customerId, unitDescription: 'Wall unit, indoor', boardId: first.boardId, symptom: 'Fan never starts' },
  });
  expect(second.status).toBe(201);
  const jobId = (second.body as { id: string }).id;
  const reading = await fetchInPage(page, `/jobs/${jobId}/readings`, {
    method: 'POST',
    body: { idempotencyKey: `capture-${suffix}`, mode: 'dcv', red: 'TP5', black: 'gnd', power: 'on', value: 0.4, raw: '0.4' },
  });
  expect(reading.status).toBe(201);
  expect((reading.body as { verdict: { verdict: string } }).verdict.verdict).toBe('low');
  const ranking = page.request.get(`/api/jobs/${jobId}/diagnosis`);

  // Known-good reference set: a good board of this model read at two points; the board page shows the measured
  // band beside the computed one, each labelled with where it comes from.
  await page.goto(`/boards/${first.boardId}`);
  await page.getByText('Record a known-good board').click();
  await page.getByLabel('Board serial').fill(`GOOD-${suffix}`);
  await page.getByLabel('15 V rail DC V powered', { exact: true }).fill('14.8');
  await page.getByLabel('DC bus + (bulk capacitor) DC V powered', { exact: true }).fill('322');
  await page.getByRole('button', { name: 'Save as a known-good reference' }).click();
  await expect(page.getByText(`1 known-good board recorded: GOOD-${suffix}.`)).toBeVisible();
  const rail = page.getByRole('row').filter({ hasText: '15 V rail' }).filter({ hasText: 'median' });
  await expect(rail).toContainText(/median 14\.8 V .*1 board/);
  await expect(rail.getByRole('cell').nth(2)).toContainText(/1[45](\.\d+)? V/);

  expect((await ranking).ok()).toBe(true);
  await page.goto(`/jobs/${jobId}`);
  await expect(page.getByRole('heading', { name: 'Probable faulty parts' })).toBeVisible({ timeout: 60_000 });
  await expect(page.getByText('No model for this board yet')).toHaveCount(0);
  await shot(page, 'capture-second-job');
});
