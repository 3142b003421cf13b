import { describe, expect, it } from 'vitest';
import { fitView, hitTest, keyToView, pinchView, toBoard, toScreen, zoomAt } from './map-geometry';

const board = { width: 1000, height: 500 };
const stage = { width: 532, height: 400 };

describe('board-map geometry', () => {
  it('fits the board inside the stage with the margin, centred', () => {
    const v = fitView(board, stage, 16);
    expect(v.scale).toBeCloseTo(0.5); // (532 − 32) / 1000 limits before (400 − 32) / 500 = 0.736
    expect(v.x).toBeCloseTo(16);
    expect(v.y).toBeCloseTo((400 - 250) / 2);
  });

  it('round-trips board and screen coordinates', () => {
    const v = { scale: 2.5, x: -40, y: 12 };
    const p = { x: 123, y: 456 };
    const back = toBoard(v, toScreen(v, p));
    expect(back.x).toBeCloseTo(123);
    expect(back.y).toBeCloseTo(456);
  });

  it('keeps the board point under the pointer fixed while zooming', () => {
    const v = { scale: 1, x: 10, y: 20 };
    const anchor = { x: 200, y: 150 };
    const before = toBoard(v, anchor);
    const z = zoomAt(v, anchor, 2);
    expect(z.scale).toBe(2);
    const after = toBoard(z, anchor);
    expect(after.x).toBeCloseTo(before.x);
    expect(after.y).toBeCloseTo(before.y);
  });

  it('clamps the zoom', () => {
    expect(zoomAt({ scale: 7, x: 0, y: 0 }, { x: 0, y: 0 }, 10).scale).toBe(8);
    expect(zoomAt({ scale: 0.3, x: 0, y: 0 }, { x: 0, y: 0 }, 0.01).scale).toBe(0.2);
  });

  it('maps the keyboard: + zooms in, − out, arrows pan, 0 fits, others are not map keys', () => {
    const v = { scale: 1, x: 0, y: 0 };
    expect(keyToView('+', v, stage, board)!.scale).toBeCloseTo(1.25);
    expect(keyToView('-', v, stage, board)!.scale).toBeCloseTo(0.8);
    expect(keyToView('ArrowLeft', v, stage, board)!.x).toBeGreaterThan(0);
    expect(keyToView('ArrowDown', v, stage, board)!.y).toBeLessThan(0);
    expect(keyToView('0', v, stage, board)).toEqual(fitView(board, stage));
    expect(keyToView('a', v, stage, board)).toBeNull();
  });

  it('pinches: spreading the fingers twice as far doubles the scale', () => {
    const v = { scale: 1, x: 0, y: 0 };
    const p = pinchView(
      v,
      [
        { x: 100, y: 100 },
        { x: 200, y: 100 },
      ],
      [
        { x: 50, y: 100 },
        { x: 250, y: 100 },
      ],
    );
    expect(p.scale).toBeCloseTo(2);
    // the midpoint (150, 100) stays over the same board point
    expect(toBoard(p, { x: 150, y: 100 }).x).toBeCloseTo(150);
  });

  it('hit-tests the nearest target within the screen radius', () => {
    const v = { scale: 2, x: 0, y: 0 };
    const targets = [
      { id: 'a', x: 10, y: 10 },
      { id: 'b', x: 20, y: 10 },
    ];
    expect(hitTest(targets, v, { x: 38, y: 20 })?.id).toBe('b'); // b is at screen (40, 20)
    expect(hitTest(targets, v, { x: 300, y: 300 })).toBeNull();
  });
});
