import type { BoardDetail, BoardModel } from '@splitscope/contract';
import type { CDPSession, Locator, Page } from '@playwright/test';
import { expect, signIn, test } from './fixtures';
import { fetchInPage, findJob, getJson, shot } from './helpers';

// Gestures on the board map: dragging a test point in the board editor, panning, wheel and two-finger pinch zoom.
// The map mirrors its view transform in data-scale / data-offset, so a test can turn board positions into screen
// positions the way the map itself does.

interface View {
  scale: number;
  x: number;
  y: number;
}
type Pt = { x: number; y: number };

const BOARD = 'board-demo-ofd-220';

async function viewOf(map: Locator): Promise<View> {
  const scale = Number(await map.getAttribute('data-scale'));
  const [x, y] = (await map.getAttribute('data-offset'))!.split(',').map(Number) as [number, number];
  return { scale, x, y };
}

/** Page coordinates of a board position. */
async function onPage(map: Locator, p: Pt): Promise<Pt> {
  const box = (await map.boundingBox())!;
  const v = await viewOf(map);
  return { x: box.x + p.x * v.scale + v.x, y: box.y + p.y * v.scale + v.y };
}

/** The board position under a page position. */
async function onBoard(map: Locator, p: Pt): Promise<Pt> {
  const box = (await map.boundingBox())!;
  const v = await viewOf(map);
  return { x: (p.x - box.x - v.x) / v.scale, y: (p.y - box.y - v.y) / v.scale };
}

/**
 * A board position in view, at least `room` screen px from every test point and connector pin and from the map's
 * edges, so a press there hits nothing.
 */
async function emptySpot(map: Locator, doc: BoardModel, room = 60): Promise<Pt> {
  const box = (await map.boundingBox())!;
  const v = await viewOf(map);
  const unit = doc.picture.width / 60;
  const taken = [...doc.testPoints, ...doc.connectors.flatMap((c) => c.pins.map((_, i) => ({ x: c.x + i * unit * 1.4, y: c.y })))];
  for (let y = 40; y < doc.picture.height - 40; y += 20) {
    for (let x = 40; x < doc.picture.width - 40; x += 20) {
      const sx = x * v.scale + v.x;
      const sy = y * v.scale + v.y;
      if (sx < room || sy < room || sx > box.width - room || sy > box.height - room) continue;
      if (taken.every((t) => Math.hypot(t.x - x, t.y - y) * v.scale > room)) return { x, y };
    }
  }
  throw new Error('no empty spot on the board in view');
}

const pointRow = (page: Page, id: string) =>
  page
    .getByRole('region', { name: 'Test points' })
    .getByRole('listitem')
    .filter({ has: page.getByRole('button', { name: id, exact: true }) });

/** The board position the editor lists for a point. */
async function listedAt(page: Page, id: string): Promise<Pt> {
  const text =
    (await pointRow(page, id)
      .getByText(/^-?\d+, -?\d+$/)
      .textContent()) ?? '';
  const m = /^(-?\d+), (-?\d+)$/.exec(text);
  expect(m, `coordinates in the row of ${id}: "${text}"`).not.toBeNull();
  return { x: Number(m![1]), y: Number(m![2]) };
}

async function mapReady(page: Page): Promise<Locator> {
  const map = page.getByTestId('board-map');
  await expect(map.locator('canvas').first()).toBeVisible();
  await expect(map).toHaveAttribute('data-scale', /\d/);
  return map;
}

/** Two fingers: down at `from` px apart about `c0`, moved in steps to `to` px apart about `c1`, lifted. */
async function pinch(cdp: CDPSession, c0: Pt, c1: Pt, from: number, to: number, steps = 10) {
  const fingers = (c: Pt, d: number) => [
    { x: c.x - d / 2, y: c.y, id: 1 },
    { x: c.x + d / 2, y: c.y, id: 2 },
  ];
  const send = (type: 'touchStart' | 'touchMove' | 'touchEnd', touchPoints: { x: number; y: number; id: number }[]) =>
    cdp.send('Input.dispatchTouchEvent', { type, touchPoints });
  // One finger lands first, as on a real screen; the stage's own drag must not run off with it.
  await send('touchStart', fingers(c0, from).slice(0, 1));
  await send('touchStart', fingers(c0, from));
  for (let i = 1; i <= steps; i++) {
    const t = i / steps;
    await send('touchMove', fingers({ x: c0.x + (c1.x - c0.x) * t, y: c0.y + (c1.y - c0.y) * t }, from + (to - from) * t));
  }
  await send('touchEnd', fingers(c1, to).slice(0, 1));
  await send('touchEnd', []);
}

test.describe('board editor, mouse', () => {
  test('an admin drags a test point to a new place and saves it; a drag is not a pan and a pan moves no point', async ({ page }) => {
    test.setTimeout(120_000);
    await signIn(page, 'admin@demo.test');
    const original = await getJson<BoardDetail>(page, `/boards/${BOARD}`);
    const doc = original.document as unknown as BoardModel;
    await page.goto(`/boards/${BOARD}`);
    await expect(page.getByRole('heading', { name: new RegExp(`version ${original.version}$`) })).toBeVisible();
    const map = await mapReady(page);
    const tp = doc.testPoints.find((t) => t.id === 'TP4')!;
    const other = doc.testPoints.find((t) => t.id === 'TP10')!;
    let saving = false;

    try {
      // A press on empty board pans the view and moves no point, not even the one picked in the list, which a click
      // on the board would place.
      await pointRow(page, other.id).getByRole('button', { name: other.id, exact: true }).click();
      const fitted = await viewOf(map);
      const spot = await onPage(map, await emptySpot(map, doc));
      await page.mouse.move(spot.x, spot.y);
      await page.mouse.down();
      await page.mouse.move(spot.x + 90, spot.y + 50, { steps: 8 });
      await page.mouse.up();
      await expect.poll(async () => (await viewOf(map)).x).toBeGreaterThan(fitted.x + 85);
      const pannedBy = await viewOf(map);
      expect(Math.abs(pannedBy.x - fitted.x - 90)).toBeLessThanOrEqual(1);
      expect(Math.abs(pannedBy.y - fitted.y - 50)).toBeLessThanOrEqual(1);
      expect(await listedAt(page, tp.id)).toEqual({ x: tp.x, y: tp.y });
      expect(await listedAt(page, other.id)).toEqual({ x: other.x, y: other.y });

      // A press on a marker, a little off its centre, drags the point by the pointer's travel and leaves the view alone.
      const panned = await viewOf(map);
      const at = await onPage(map, tp);
      const grab = { x: at.x + 8, y: at.y - 6 };
      const travel = { x: 120, y: 70 };
      await page.mouse.move(grab.x, grab.y);
      await page.mouse.down();
      await page.mouse.move(grab.x + travel.x, grab.y + travel.y, { steps: 10 });
      await page.mouse.up();
      expect(await viewOf(map)).toEqual(panned);
      const moved = await listedAt(page, tp.id);
      // Within a screen pixel or so: the browser rounds mouse positions to whole pixels.
      expect(Math.abs(moved.x - tp.x - travel.x / panned.scale) * panned.scale).toBeLessThan(1.5);
      expect(Math.abs(moved.y - tp.y - travel.y / panned.scale) * panned.scale).toBeLessThan(1.5);
      // The marker is drawn where the list says: a click there selects the point.
      const movedOnPage = await onPage(map, moved);
      await page.mouse.click(movedOnPage.x, movedOnPage.y);
      await expect(pointRow(page, tp.id).getByRole('button', { name: tp.id, exact: true })).toHaveAttribute('aria-pressed', 'true');

      // The click that ends a drag is swallowed, but only that one: the next click selects another point.
      const otherOnPage = await onPage(map, other);
      await page.mouse.click(otherOnPage.x, otherOnPage.y);
      await expect(pointRow(page, other.id).getByRole('button', { name: other.id, exact: true })).toHaveAttribute('aria-pressed', 'true');
      expect(await listedAt(page, tp.id)).toEqual(moved);
      expect(await listedAt(page, other.id)).toEqual({ x: other.x, y: other.y });
      await shot(page, 'board-editor-dragged');

      // Saved as a new version with the dragged position, and still there after a reload.
      await page.getByLabel('Note for this version').fill('TP4 moved by dragging');
      saving = true;
      await page.getByRole('button', { name: 'Save as a new version' }).click();
      await expect(page.getByText(/^Saved:/)).toBeVisible({ timeout: 90_000 });
      const saved = await getJson<BoardDetail>(page, `/boards/${BOARD}`);
      expect(saved.version).toBe(original.version + 1);
      const savedTp = (saved.document as unknown as BoardModel).testPoints.find((t) => t.id === tp.id)!;
      expect({ x: savedTp.x, y: savedTp.y }).toEqual(moved);
      await page.reload();
      await expect(page.getByRole('heading', { name: new RegExp(`version ${saved.version}$`) })).toBeVisible();
      await mapReady(page);
      expect(await listedAt(page, tp.id)).toEqual(moved);
    } finally {
      // Later tests start jobs on this board: give it its test points back (as a newer version).
      if (saving) {
        const restored = await fetchInPage(page, `/boards/${BOARD}`, { method: 'PATCH', body: { document: doc, note: 'test points as seeded' } });
        expect(restored.status).toBe(200);
      }
    }
  });
});

test.describe('touch screen', () => {
  test.use({ hasTouch: true });

  test('a two-finger pinch zooms about the fingers, and a tap afterwards selects the point under it', async ({ page }) => {
    await signIn(page, 'tech@demo.test');
    const job = await findJob(page, ['received', 'diagnosing']);
    const doc = job.board.document as unknown as BoardModel;
    await page.goto(`/jobs/${job.id}?mode=free`);
    const map = await mapReady(page);
    const cdp = await page.context().newCDPSession(page);
    const fitted = await viewOf(map);
    const box = (await map.boundingBox())!;

    // Fingers spread from 80 to 200 px apart about a place left of and above the map's centre.
    const c0 = { x: box.x + box.width * 0.35, y: box.y + box.height * 0.4 };
    const under = await onBoard(map, c0);
    await pinch(cdp, c0, c0, 80, 200);
    await expect.poll(async () => (await viewOf(map)).scale).toBeGreaterThan(fitted.scale * 2);
    const zoomed = await viewOf(map);
    expect(zoomed.scale).toBeCloseTo(fitted.scale * 2.5, 1);
    const still = await onBoard(map, c0);
    // The board point under the fingers stays under them (to a screen pixel or two, from the rounded offset).
    expect(Math.hypot(still.x - under.x, still.y - under.y) * zoomed.scale).toBeLessThan(3);
    await expect(page.locator('#reading-h'), 'a pinch is not a tap').toHaveCount(0);

    // Fingers that move while they pinch carry the board with them: what was under c1's start ends under its end.
    const c1 = { x: box.x + box.width * 0.6, y: box.y + box.height * 0.55 };
    const c2 = { x: c1.x - 70, y: c1.y + 40 };
    const held = await onBoard(map, c1);
    await pinch(cdp, c1, c2, 200, 130);
    await expect.poll(async () => (await viewOf(map)).scale).toBeLessThan(zoomed.scale);
    const after = await viewOf(map);
    expect(after.scale).toBeCloseTo(zoomed.scale * 0.65, 1);
    const landed = await onBoard(map, c2);
    expect(Math.hypot(landed.x - held.x, landed.y - held.y) * after.scale).toBeLessThan(3);

    // A tap on a marker in the zoomed view selects that point (found in the view as it is now, not as it was).
    // Chosen by where they sit in the map, not on the page: opening the reading panel may scroll the page.
    const v = await viewOf(map);
    const visible = doc.testPoints.filter((t) => {
      const x = t.x * v.scale + v.x;
      const y = t.y * v.scale + v.y;
      return x > 30 && x < box.width - 30 && y > 30 && y < box.height - 60;
    });
    expect(visible.length, 'test points in the zoomed view').toBeGreaterThan(1);
    for (const t of visible.slice(0, 2)) {
      await map.scrollIntoViewIfNeeded();
      const p = await onPage(map, t);
      await page.touchscreen.tap(p.x, p.y);
      await expect(page.getByRole('heading', { name: new RegExp(` at ${t.id}\\b`) })).toBeVisible();
    }
    await shot(page, 'bench-map-pinched');
  });

  test('in the board editor a finger drags a point, a finger on empty board pans, and a pinch places nothing', async ({ page }) => {
    test.setTimeout(120_000);
    await signIn(page, 'admin@demo.test');
    const original = await getJson<BoardDetail>(page, `/boards/${BOARD}`);
    const doc = original.document as unknown as BoardModel;
    await page.goto(`/boards/${BOARD}`);
    const map = await mapReady(page);
    const cdp = await page.context().newCDPSession(page);
    const tp = doc.testPoints.find((t) => t.id === 'TP9')!;
    const send = (type: 'touchStart' | 'touchMove' | 'touchEnd', touchPoints: { x: number; y: number }[]) =>
      cdp.send('Input.dispatchTouchEvent', { type, touchPoints });
    const swipe = async (from: Pt, by: Pt) => {
      await send('touchStart', [from]);
      for (let i = 1; i <= 8; i++) await send('touchMove', [{ x: from.x + (by.x * i) / 8, y: from.y + (by.y * i) / 8 }]);
      await send('touchEnd', []);
    };

    // With a point picked in the list, a click on the board would place it there; a pinch must not.
    await pointRow(page, tp.id).getByRole('button', { name: tp.id, exact: true }).click();
    const fitted = await viewOf(map);
    const spot = await onPage(map, await emptySpot(map, doc, 110));
    await pinch(cdp, spot, spot, 60, 120);
    await expect.poll(async () => (await viewOf(map)).scale).toBeGreaterThan(fitted.scale * 1.5);
    expect(await listedAt(page, tp.id)).toEqual({ x: tp.x, y: tp.y });

    // A tap on another marker selects it and moves nothing; the mouse events a browser sends after a tap start no drag.
    const tapped = doc.testPoints.find((t) => t.id === 'TP10')!;
    const tapAt = await onPage(map, tapped);
    await page.touchscreen.tap(tapAt.x, tapAt.y);
    await expect(pointRow(page, tapped.id).getByRole('button', { name: tapped.id, exact: true })).toHaveAttribute('aria-pressed', 'true');
    expect(await listedAt(page, tapped.id)).toEqual({ x: tapped.x, y: tapped.y });

    // One finger on empty board pans.
    const zoomed = await viewOf(map);
    const empty = await onPage(map, await emptySpot(map, doc));
    await swipe(empty, { x: -60, y: 30 });
    await expect.poll(async () => (await viewOf(map)).x).toBeLessThan(zoomed.x - 40);
    expect(await listedAt(page, tp.id)).toEqual({ x: tp.x, y: tp.y });
    expect(await listedAt(page, tapped.id)).toEqual({ x: tapped.x, y: tapped.y });

    // One finger on a marker drags the point, and the view stays.
    const panned = await viewOf(map);
    const at = await onPage(map, tp);
    await swipe(at, { x: 50, y: -40 });
    const moved = await listedAt(page, tp.id);
    expect(await viewOf(map)).toEqual(panned);
    expect(Math.abs(moved.x - tp.x - 50 / panned.scale) * panned.scale).toBeLessThan(1.5);
    expect(Math.abs(moved.y - tp.y + 40 / panned.scale) * panned.scale).toBeLessThan(1.5);
    await shot(page, 'board-editor-touch-dragged');
  });
});

test('the mouse wheel zooms about the pointer', async ({ page }) => {
  await signIn(page, 'tech@demo.test');
  const job = await findJob(page, ['received', 'diagnosing']);
  await page.goto(`/jobs/${job.id}?mode=free`);
  const map = await mapReady(page);
  const box = (await map.boundingBox())!;
  const fitted = await viewOf(map);
  const at = { x: box.x + box.width * 0.7, y: box.y + box.height * 0.3 };
  await page.mouse.move(at.x, at.y);
  const under = await onBoard(map, at);
  await page.mouse.wheel(0, -100);
  await expect.poll(async () => (await viewOf(map)).scale).toBeGreaterThan(fitted.scale);
  await page.mouse.wheel(0, -100);
  await expect.poll(async () => (await viewOf(map)).scale).toBeCloseTo(fitted.scale * 1.15 ** 2, 2);
  const still = await onBoard(map, at);
  expect(Math.hypot(still.x - under.x, still.y - under.y) * (await viewOf(map)).scale).toBeLessThan(3);
});
