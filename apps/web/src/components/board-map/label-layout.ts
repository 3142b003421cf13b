/**
 * Where each test-point label goes. Labels keep their size on screen while the board zooms, so collisions depend
 * on the scale: the layout works in screen pixels at one scale and is redone when the scale changes (not on pan).
 * Each label tries a few places around its marker and takes the first one that stays inside the picture and
 * touches no marker, no fixed obstacle and no label placed before it. Labels left without one then try the same
 * places with their short form (the test point's id alone: a technician finds "TP7" on the board and reads the rest
 * on hover), then places a row or more away, joined to their marker by a leader line that crosses nothing either;
 * the rest are hidden.
 */

/**
 * Where a label box may go, as its top-left offset from the marker centre: x = a·width + b·gap, y = c·height + d·gap
 * for each [a, b, c, d]. Right first, where a reader looks, then left, above, below and the four diagonals.
 */
const PLACES = [
  [0, 1, -0.5, 0],
  [-1, -1, -0.5, 0],
  [-0.5, 0, -1, -1],
  [-0.5, 0, 0, 1],
  [0, 0.7, -1, -0.7],
  [0, 0.7, 0, 0.7],
  [-1, -0.7, -1, -0.7],
  [-1, -0.7, 0, 0.7],
] as const;
const placeX = (c: number, w: number, gap: number) => PLACES[c]![0] * w + PLACES[c]![1] * gap;
const placeY = (c: number, h: number, gap: number) => PLACES[c]![2] * h + PLACES[c]![3] * gap;

/**
 * Places away from the marker, as [a, b, dir]: x = a·width + b·markerHalf, and 1 to FAR_ROWS label rows beyond
 * the near place above (dir −1) or below (dir 1). Centred over or under the marker first, then slid to either
 * side of it: the eye follows a short, nearly upright leader line most easily.
 */
const FAR_ROWS = 3;
const ROW = 3; // px between label rows
const FAR = [
  [-0.5, 0, -1],
  [-1, 1, -1],
  [0, -1, -1],
  [-0.5, 0, 1],
  [-1, 1, 1],
  [0, -1, 1],
] as const;
/** Leader lines are checked for what they cross at this spacing, screen px. */
const STEP = 5;
/**
 * Far places are for a few crowded labels. Where more than this many find no near place the board is read zoomed
 * in, a map strewn with leader lines would be noise, and trying them all would cost a zoom frame its budget.
 */
const FAR_MAX = 24;

export interface LabelInput {
  /** Board coordinates of the markers. */
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
  /** Label box sizes, screen px. */
  widths: ArrayLike<number>;
  /** Box widths of the labels' short forms (the test point id), where a point has one. */
  shortWidths?: ArrayLike<number>;
  heights: ArrayLike<number>;
  board: { width: number; height: number };
  /** Half the side of the square a marker covers, and the marker-to-label gap, screen px. */
  markerHalf: number;
  gap: number;
  /** Fixed boxes in board coordinates plus screen-px offset and size (connector pins and their names). */
  obstacles?: { x: number; y: number; dx: number; dy: number; w: number; h: number }[];
}

/** Placed label offsets (screen px, box top-left from the marker centre): NaN where the label is hidden. */
export interface LabelLayout {
  scale: number;
  dx: Float32Array;
  dy: Float32Array;
  /** 1 where the label sits away from its marker and a leader line joins them. */
  led: Uint8Array;
  /** 1 where the label is shown in its short form. */
  short: Uint8Array;
}

/** A placed label's box width: its short form's where the layout chose that. */
export const placedWidth = (input: LabelInput, layout: LabelLayout, i: number) =>
  layout.short[i] && input.shortWidths ? input.shortWidths[i]! : input.widths[i]!;

const CELL = 64;

/** Boxes bucketed by grid cell, so each test looks at a few neighbours, not at every label. */
class BoxGrid {
  private cells = new Map<number, number[]>();
  private boxes: number[] = [];
  private removed = new Set<number>();
  constructor(private cols: number) {}

  /** Adds a box; the id it returns can take it out again. */
  add(x: number, y: number, w: number, h: number): number {
    const id = this.boxes.length;
    this.boxes.push(x, y, x + w, y + h);
    this.each(x, y, w, h, (key) => {
      const list = this.cells.get(key);
      if (list) list.push(id);
      else this.cells.set(key, [id]);
      return false;
    });
    return id;
  }

  remove(id: number) {
    this.removed.add(id);
  }

  /** Whether a box touches any box but `except`. */
  hits(x: number, y: number, w: number, h: number, except = -1): boolean {
    const b = this.boxes;
    return this.each(x, y, w, h, (key) => {
      const list = this.cells.get(key);
      if (!list) return false;
      for (const id of list)
        if (id !== except && x < b[id + 2]! && x + w > b[id]! && y < b[id + 3]! && y + h > b[id + 1]! && !this.removed.has(id)) return true;
      return false;
    });
  }

  private each(x: number, y: number, w: number, h: number, f: (key: number) => boolean): boolean {
    const c0 = Math.max(0, Math.floor(x / CELL));
    const r0 = Math.max(0, Math.floor(y / CELL));
    const c1 = Math.min(this.cols - 1, Math.floor((x + w) / CELL));
    const r1 = Math.floor((y + h) / CELL);
    for (let r = r0; r <= r1; r++) for (let c = c0; c <= c1; c++) if (f(r * this.cols + c)) return true;
    return false;
  }
}

export function layoutLabels(input: LabelInput, scale: number): LabelLayout {
  const { xs, ys, widths, heights, board, markerHalf: m, gap } = input;
  const n = xs.length;
  const W = board.width * scale;
  const H = board.height * scale;
  const grid = new BoxGrid(Math.max(1, Math.ceil(W / CELL) + 1));
  for (let i = 0; i < n; i++) grid.add(xs[i]! * scale - m, ys[i]! * scale - m, 2 * m, 2 * m);
  for (const o of input.obstacles ?? []) grid.add(o.x * scale + o.dx, o.y * scale + o.dy, o.w, o.h);

  const dx = new Float32Array(n).fill(NaN);
  const dy = new Float32Array(n).fill(NaN);
  const led = new Uint8Array(n);
  const put = (i: number, x: number, y: number, w: number, h: number) => {
    dx[i] = x - xs[i]! * scale;
    dy[i] = y - ys[i]! * scale;
    return grid.add(x, y, w, h);
  };
  // Clamp inside the picture: a label running past the board edge reads as belonging to nothing.
  const clampX = (x: number, w: number) => Math.max(0, Math.min(W - w, x));
  const clampY = (y: number, h: number) => Math.max(0, Math.min(H - h, y));

  /** Puts label i in the first near place clear of everything but box `except`: its grid id, or −1. */
  const near = (i: number, w: number, except = -1): number => {
    const sx = xs[i]! * scale;
    const sy = ys[i]! * scale;
    const h = heights[i]!;
    for (let c = 0; c < PLACES.length; c++) {
      const x = clampX(sx + placeX(c, w, gap), w);
      const y = clampY(sy + placeY(c, h, gap), h);
      if (!grid.hits(x, y, w, h, except)) return put(i, x, y, w, h);
    }
    return -1;
  };

  // Every point first reserves a near place for its short form, so a crowded point keeps at least its id; then
  // every label tries a near place in full (its own reservation aside) and frees the reservation when it finds one.
  const shortWidths = input.shortWidths;
  const short = new Uint8Array(n);
  const reserved = new Int32Array(n).fill(-1);
  if (shortWidths)
    for (let i = 0; i < n; i++) {
      if (shortWidths[i]! >= widths[i]!) continue;
      reserved[i] = near(i, shortWidths[i]!);
      if (reserved[i]! >= 0) short[i] = 1;
    }
  let hidden = 0;
  for (let i = 0; i < n; i++) {
    if (near(i, widths[i]!, reserved[i]) >= 0) {
      if (reserved[i]! >= 0) grid.remove(reserved[i]!);
      short[i] = 0;
    } else if (reserved[i]! < 0) hidden++;
  }

  if (hidden > FAR_MAX) return { scale, dx, dy, led, short };
  for (let i = 0; i < n && hidden > 0; i++) {
    if (!Number.isNaN(dx[i]!)) continue;
    hidden--;
    const sx = xs[i]! * scale;
    const sy = ys[i]! * scale;
    // Away from its marker a label is short where it can be: the leader line already says whose it is.
    const w = shortWidths ? Math.min(shortWidths[i]!, widths[i]!) : widths[i]!;
    const h = heights[i]!;
    far: for (let r = 1; r <= FAR_ROWS; r++) {
      for (const [a, b, dir] of FAR) {
        const x = clampX(sx + a * w + b * m, w);
        const y = clampY(sy + (dir < 0 ? -h - gap : gap) + dir * r * (h + ROW), h);
        if (grid.hits(x, y, w, h) || !leaderClear(grid, sx, sy, x, y, w, h, m)) continue;
        put(i, x, y, w, h);
        markLeader(grid, sx, sy, x, y, w, h, m);
        led[i] = 1;
        if (shortWidths && shortWidths[i]! < widths[i]!) short[i] = 1;
        break far;
      }
    }
  }
  return { scale, dx, dy, led, short };
}

/** Where a leader line from a marker centre meets a label box: the box's nearest point. */
export function leaderEnd(sx: number, sy: number, x: number, y: number, w: number, h: number): [number, number] {
  return [Math.max(x, Math.min(x + w, sx)), Math.max(y, Math.min(y + h, sy))];
}

/** Visits points along the leader line outside the marker's own square, every STEP px; stops when `f` says so. */
function alongLeader(sx: number, sy: number, x: number, y: number, w: number, h: number, m: number, f: (px: number, py: number) => boolean): boolean {
  const [ex, ey] = leaderEnd(sx, sy, x, y, w, h);
  const len = Math.hypot(ex - sx, ey - sy);
  for (let t = STEP; t < len; t += STEP) {
    const px = sx + ((ex - sx) * t) / len;
    const py = sy + ((ey - sy) * t) / len;
    if (Math.abs(px - sx) <= m + 1 && Math.abs(py - sy) <= m + 1) continue;
    if (f(px, py)) return true;
  }
  return false;
}

const leaderClear = (grid: BoxGrid, sx: number, sy: number, x: number, y: number, w: number, h: number, m: number) =>
  !alongLeader(sx, sy, x, y, w, h, m, (px, py) => grid.hits(px - 1, py - 1, 2, 2));

/** A placed leader line is kept clear of later labels too. */
function markLeader(grid: BoxGrid, sx: number, sy: number, x: number, y: number, w: number, h: number, m: number) {
  alongLeader(sx, sy, x, y, w, h, m, (px, py) => (grid.add(px - 1, py - 1, 2, 2), false));
}

/** Where a label must go even when the layout hid it (the selected or hovered point): its first place, clamped. */
export function forcedPlace(input: LabelInput, i: number, scale: number): [number, number] {
  const w = input.widths[i]!;
  const h = input.heights[i]!;
  const cx = placeX(0, w, input.gap);
  const cy = placeY(0, h, input.gap);
  const sx = input.xs[i]! * scale;
  const sy = input.ys[i]! * scale;
  const x = Math.max(0, Math.min(input.board.width * scale - w, sx + cx));
  const y = Math.max(0, Math.min(input.board.height * scale - h, sy + cy));
  return [x - sx, y - sy];
}
