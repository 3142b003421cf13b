/**
 * Board-map geometry: pure functions over board coordinates (the picture's pixel space) and screen coordinates
 * (the stage's CSS pixels). No React or Konva here, so hit-testing and the view transform are unit-tested alone.
 */

export interface Vec {
  x: number;
  y: number;
}

/** Board → screen: screen = board · scale + offset. */
export interface View {
  scale: number;
  x: number;
  y: number;
}

export interface Size {
  width: number;
  height: number;
}

export const MIN_SCALE = 0.2;
export const MAX_SCALE = 8;

const clampScale = (s: number) => Math.min(MAX_SCALE, Math.max(MIN_SCALE, s));

/** The view that shows the whole board centred in the stage with a margin. */
export function fitView(board: Size, stage: Size, margin = 16): View {
  const w = Math.max(1, stage.width - 2 * margin);
  const h = Math.max(1, stage.height - 2 * margin);
  const scale = clampScale(Math.min(w / board.width, h / board.height));
  return { scale, x: (stage.width - board.width * scale) / 2, y: (stage.height - board.height * scale) / 2 };
}

export function toBoard(view: View, screen: Vec): Vec {
  return { x: (screen.x - view.x) / view.scale, y: (screen.y - view.y) / view.scale };
}

export function toScreen(view: View, board: Vec): Vec {
  return { x: board.x * view.scale + view.x, y: board.y * view.scale + view.y };
}

/** Zoom by `factor` keeping the board point under `anchor` (screen) where it is. */
export function zoomAt(view: View, anchor: Vec, factor: number): View {
  const scale = clampScale(view.scale * factor);
  const b = toBoard(view, anchor);
  return { scale, x: anchor.x - b.x * scale, y: anchor.y - b.y * scale };
}

export function panBy(view: View, dx: number, dy: number): View {
  return { ...view, x: view.x + dx, y: view.y + dy };
}

/** Keyboard control of the map: + / − zoom about the stage centre, arrows pan, 0 fits. Null: not a map key. */
export function keyToView(key: string, view: View, stage: Size, board: Size): View | null {
  const centre = { x: stage.width / 2, y: stage.height / 2 };
  const step = Math.max(24, Math.min(stage.width, stage.height) / 8);
  switch (key) {
    case '+':
    case '=':
      return zoomAt(view, centre, 1.25);
    case '-':
    case '_':
      return zoomAt(view, centre, 1 / 1.25);
    case 'ArrowLeft':
      return panBy(view, step, 0);
    case 'ArrowRight':
      return panBy(view, -step, 0);
    case 'ArrowUp':
      return panBy(view, 0, step);
    case 'ArrowDown':
      return panBy(view, 0, -step);
    case '0':
      return fitView(board, stage);
    default:
      return null;
  }
}

/** Two-finger pinch: the new view from the previous and current touch pairs (screen coordinates). */
export function pinchView(view: View, before: [Vec, Vec], after: [Vec, Vec]): View {
  const dist = (p: [Vec, Vec]) => Math.hypot(p[0].x - p[1].x, p[0].y - p[1].y) || 1;
  const mid = (p: [Vec, Vec]) => ({ x: (p[0].x + p[1].x) / 2, y: (p[0].y + p[1].y) / 2 });
  const m0 = mid(before);
  const m1 = mid(after);
  const zoomed = zoomAt(view, m0, dist(after) / dist(before));
  return panBy(zoomed, m1.x - m0.x, m1.y - m0.y);
}

export interface HitTarget extends Vec {
  id: string;
}

/**
 * The target nearest to a screen point within `radiusPx` screen pixels (markers keep their size on screen when
 * zoomed, so the hit radius is in screen pixels too). Null when none is close enough.
 */
export function hitTest<T extends HitTarget>(targets: readonly T[], view: View, screen: Vec, radiusPx = 22): T | null {
  let best: T | null = null;
  let bestD = radiusPx;
  for (const t of targets) {
    const s = toScreen(view, t);
    const d = Math.hypot(s.x - screen.x, s.y - screen.y);
    if (d <= bestD) {
      best = t;
      bestD = d;
    }
  }
  return best;
}

/** How a reading's state is drawn: the shape and the text label carry it, colour only repeats it. */
export type MarkerState = 'unmeasured' | 'healthy' | 'low' | 'high';

export const MARKER: Record<MarkerState, { shape: 'ring' | 'check' | 'down' | 'up'; label: string; colour: string }> = {
  unmeasured: { shape: 'ring', label: 'not measured', colour: '#4b5563' },
  healthy: { shape: 'check', label: 'healthy', colour: '#1d6b3a' },
  low: { shape: 'down', label: 'low', colour: '#1f4fa3' },
  high: { shape: 'up', label: 'high', colour: '#a3261f' },
};

/** Outline of a marker shape centred on 0,0 with "radius" r, as a flat Konva points list. */
export function markerPoints(shape: 'down' | 'up' | 'check', r: number): number[] {
  if (shape === 'down') return [-r, -r * 0.7, r, -r * 0.7, 0, r];
  if (shape === 'up') return [-r, r * 0.7, r, r * 0.7, 0, -r];
  return [-r * 0.5, 0, -r * 0.1, r * 0.45, r * 0.55, -r * 0.45];
}
