import { describe, expect, it } from 'vitest';
import { nearest } from './pick';

describe('nearest', () => {
  const pts = [
    { x: 100, y: 100 },
    { x: 110, y: 100 },
  ];
  it('finds the closest point within the reach in screen pixels', () => {
    const view = { scale: 2, x: 10, y: 0 };
    expect(nearest(pts, view, 10 + 218, 200, 22)).toBe(1);
    expect(nearest(pts, view, 10 + 202, 200, 22)).toBe(0);
  });
  it('answers -1 beyond the reach, whatever the zoom', () => {
    expect(nearest(pts, { scale: 0.5, x: 0, y: 0 }, 50, 80, 22)).toBe(-1);
    expect(nearest(pts, { scale: 0.5, x: 0, y: 0 }, 50, 70, 22)).toBe(0);
  });
});
