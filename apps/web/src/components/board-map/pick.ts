import type { View } from '@/lib/map-geometry';

/**
 * The index of the board position nearest to a screen point within `radiusPx` screen pixels, or -1. Markers keep
 * their size on screen, so the reach is in screen pixels; compared in board units so a pointer move allocates
 * nothing even with thousands of points.
 */
export function nearest(items: readonly { x: number; y: number }[], view: View, sx: number, sy: number, radiusPx: number): number {
  const bx = (sx - view.x) / view.scale;
  const by = (sy - view.y) / view.scale;
  let best = -1;
  let bestD = (radiusPx / view.scale) ** 2;
  for (let i = 0; i < items.length; i++) {
    const dx = items[i]!.x - bx;
    const dy = items[i]!.y - by;
    const d = dx * dx + dy * dy;
    if (d <= bestD) {
      best = i;
      bestD = d;
    }
  }
  return best;
}
