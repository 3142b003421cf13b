/**
 * What steers a job before its first reading, its photos, and a board model's known-good references, as the bench
 * sees them (each test makes its own data through the API):
 * - a job opened with fault code F7 says before any reading where to start (sections, not every part) and why
 *   ("fault code F7 … points at the Fan supply switch section: ×8");
 * - a picture of about 4 MB lands in the job's Photos tab stored smaller (JPEG); a refused file is listed on the job with
 *   its reason, not on the intake form;
 * - the board editor shows each point's band from its three labelled sources and the recorded good boards.
 * Screenshots at 1024×768 and 390×844 go to docs/screens/.
 */
import { randomFillSync } from 'node:crypto';
import { crc32, deflateSync } from 'node:zlib';
import type { Page } from '@playwright/test';
import { expect, signIn, test } from './fixtures';
import { api, copyBoard, createJob, DEMO_BOARD_IDS } from './support/shop-data';

const DAY = '2026-12-05';
const sizes = [
  { name: '1024', width: 1024, height: 768 },
  { name: '390', width: 390, height: 844 },
];
async function shots(page: Page, what: string) {
  for (const s of sizes) {
    await page.setViewportSize({ width: s.width, height: s.height });
    await page.screenshot({ path: `docs/screens/${DAY}-${what}-${s.name}.png` });
  }
  await page.setViewportSize({ width: 1024, height: 768 });
}

/**
 * A 1400×1000 PNG of noise, about 4.2 MB (noise does not compress): a phone photo's weight. Written here (PNG
 * chunks, zlib, CRC-32 per ISO/IEC 15948 / the PNG specification) so the spec needs no image library.
 */
function phonePhoto(): Buffer {
  const w = 1400;
  const h = 1000;
  const raw = randomFillSync(Buffer.alloc((w * 3 + 1) * h));
  // Each row starts with its filter type byte: 0 (none).
  for (let y = 0; y < h; y++) raw[y * (w * 3 + 1)] = 0;
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(body));
    return Buffer.concat([len, body, crc]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(w, 0);
  ihdr.writeUInt32BE(h, 4);
  ihdr.set([8, 2, 0, 0, 0], 8);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 1 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

test.describe.configure({ timeout: 180_000 });

test('a fault code steers the first tests, and the bench says why', async ({ page }) => {
  await signIn(page, 'tech@demo.test');
  const job = await createJob(page, { faultCode: 'F7' });
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto(`/jobs/${job.id}`);
  const before = page.getByTestId('before-first-reading');
  await expect(before).toContainText('Fault code F7', { timeout: 120_000 });
  await expect(before).toContainText('Where to start');
  const why = page.getByTestId('prior-reasons');
  // The weight is the shop's (×8 in the demo table; a table seeded before weights existed says ×5, the default).
  await expect(why).toContainText(/points at the Fan supply switch section: ×\d+/);
  await expect(why).toContainText('Q1');
  await shots(page, 'priors');
});

test.describe('photos', () => {
  // The browser logs the refused upload's 415 answer; that is the refusal this test provokes.
  test.use({ expectedConsoleErrors: [/status of 415/] });
  test('photos on the job: a 4 MB phone photo is resized and shown, a refused file is listed on the job', async ({ page }) => {
    await signIn(page, 'tech@demo.test');
    const job = await createJob(page);
    await page.setViewportSize({ width: 1024, height: 768 });
    await page.goto(`/jobs/${job.id}?tab=photos`);
    const photo = phonePhoto();
    expect(photo.length).toBeGreaterThan(4_000_000);
    const picker = page.getByLabel('Add photos (PNG or JPEG, phone photos are resized)');
    await picker.setInputFiles({ name: 'board-front.png', mimeType: 'image/png', buffer: photo });
    await expect(page.getByRole('heading', { name: 'Photos (1)' })).toBeVisible({ timeout: 60_000 });
    await expect(page.getByText(/board-front\.png · 1400×1000 · stored \d\.\d MB \(sent 4\.\d MB\)/)).toBeVisible();
    await picker.setInputFiles({ name: 'notes.txt', mimeType: 'text/plain', buffer: Buffer.from('not a photo') });
    await expect(page.getByTestId('photo-refusals')).toContainText('notes.txt', { timeout: 30_000 });
    await expect(page.getByTestId('photo-refusals')).toContainText('Only PNG and JPEG pictures are accepted');
    await shots(page, 'photos');
  });
});

test('known-good references: three labelled sources per point in the board editor', async ({ page }) => {
  await signIn(page, 'admin@demo.test');
  const board = await copyBoard(page, DEMO_BOARD_IDS.outdoorFan);
  for (const [serial, rail] of [
    ['GOOD-A', 14.96],
    ['GOOD-B', 14.9],
    ['GOOD-C', 15.02],
  ] as const) {
    await api.send(
      page,
      'POST',
      `/boards/${board.id}/references`,
      {
        serial,
        readings: [
          { mode: 'dcv', red: 'TP3', black: 'gnd', power: 'on', value: rail },
          { mode: 'dcv', red: 'TP5', black: 'gnd', power: 'on', value: rail - 0.2 },
        ],
      },
      201,
    );
  }
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto(`/boards/${board.id}`);
  const panel = page.getByRole('region', { name: 'Known-good references' });
  await expect(panel).toContainText('3 known-good boards recorded: GOOD-C, GOOD-B, GOOD-A', { timeout: 60_000 });
  await expect(panel.getByRole('columnheader', { name: 'Computed from the model' })).toBeVisible();
  await expect(panel.getByRole('columnheader', { name: 'Measured on known-good boards' })).toBeVisible();
  await expect(panel.getByRole('columnheader', { name: 'Published' })).toBeVisible();
  await expect(panel).toContainText(/median 15 V ± \d+ mV/);
  await expect(panel).toContainText('3 boards');
  await expect(panel).toContainText('MC7815C');
  await panel.scrollIntoViewIfNeeded();
  await shots(page, 'refs');
});
