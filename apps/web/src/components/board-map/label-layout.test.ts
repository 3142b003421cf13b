import { describe, expect, it } from 'vitest';
import { layoutLabels, leaderEnd, type LabelInput } from './label-layout';

const base = (xs: number[], ys: number[], w = 60): LabelInput => ({
  xs,
  ys,
  widths: xs.map(() => w),
  heights: xs.map(() => 15),
  board: { width: 1200, height: 930 },
  markerHalf: 12,
  gap: 13,
});

type Box = [number, number, number, number];
function boxes(input: LabelInput, scale: number): (Box | null)[] {
  const { dx, dy } = layoutLabels(input, scale);
  return Array.from(dx, (x, i) =>
    Number.isNaN(x) ? null : ([input.xs[i]! * scale + x, input.ys[i]! * scale + dy[i]!, input.widths[i]!, input.heights[i]!] as Box),
  );
}
const overlap = (a: Box, b: Box) => a[0] < b[0] + b[2] && b[0] < a[0] + a[2] && a[1] < b[1] + b[3] && b[1] < a[1] + a[3];

describe('label layout', () => {
  it('puts a lone label to the right of its marker', () => {
    const { dx, dy } = layoutLabels(base([500], [500]), 1);
    expect([dx[0], dy[0]]).toEqual([13, -7.5]);
  });

  it('moves a label that would run past the picture edge to the other side', () => {
    // the demo board's TP12 sits 127 px from the right edge with a long label
    const input = base([1073], [664], 150);
    const [b] = boxes(input, 0.8);
    expect(b).not.toBeNull();
    expect(b![0] + b![2]).toBeLessThanOrEqual(1200 * 0.8);
    expect(b![0]).toBeGreaterThanOrEqual(0);
  });

  it('keeps neighbouring labels apart (TP8 and TP7 of the demo board, 86 px apart on one row)', () => {
    const input = base([881, 967, 1053], [106, 106, 106], 140);
    for (const scale of [0.6, 0.8, 1, 1.5]) {
      const placed = boxes(input, scale).filter((b): b is Box => b !== null);
      expect(placed.length).toBeGreaterThan(0);
      for (let i = 0; i < placed.length; i++) for (let j = i + 1; j < placed.length; j++) expect(overlap(placed[i]!, placed[j]!)).toBe(false);
    }
  });

  it('gives TP8 of the demo outdoor board a label at fit zoom, a row up with a leader line that crosses nothing', () => {
    // the demo OFD-220's twelve test points and their "TPn name" label widths as the bench map measures them
    const xs = [121, 587, 673, 501, 967, 1053, 967, 881, 121, 541, 1073, 1073];
    const ys = [106, 106, 172, 304, 172, 106, 106, 106, 598, 532, 532, 664];
    const widths = [85, 124, 78, 81, 191, 103, 150, 164, 170, 171, 149, 167];
    const input = { ...base(xs, ys), widths };
    // fit on a 1280 × 800 screen, then two steps of zoom
    for (const scale of [0.411, 0.6, 0.7]) {
      const { led } = layoutLabels(input, scale);
      const placed = boxes(input, scale);
      // TP7 and TP8 share one gap above the row, walled in by TP6's label and TP5's marker and label: one of
      // them takes it, the other shows on hover, selection or closer zoom
      const hidden = placed.flatMap((b, i) => (b ? [] : [`TP${i + 1}`]));
      expect(hidden.length, `hidden at ${scale}: ${hidden.join()}`).toBeLessThanOrEqual(1);
      for (const id of hidden) expect(['TP7', 'TP8']).toContain(id);
      const markers = xs.map((x, i): Box => [x * scale - 12, ys[i]! * scale - 12, 24, 24]);
      for (let i = 0; i < placed.length; i++) {
        const b = placed[i];
        if (!b) continue;
        for (let j = 0; j < placed.length; j++) if (j !== i && placed[j]) expect(overlap(b, placed[j]!), `labels ${i + 1}, ${j + 1}`).toBe(false);
        for (const mk of markers) expect(overlap(b, mk)).toBe(false);
        if (!led[i]) continue;
        // walked in 1 px steps outside its own marker, the leader line touches no other label or marker
        const [sx, sy] = [xs[i]! * scale, ys[i]! * scale];
        const [ex, ey] = leaderEnd(sx, sy, b[0], b[1], b[2], b[3]);
        const len = Math.hypot(ex - sx, ey - sy);
        for (let t = 0; t < len - 1; t++) {
          const p: Box = [sx + ((ex - sx) * t) / len, sy + ((ey - sy) * t) / len, 0.01, 0.01];
          if (overlap(p, markers[i]!)) continue;
          for (let j = 0; j < placed.length; j++) {
            if (j !== i) expect((placed[j] && overlap(p, placed[j]!)) || overlap(p, markers[j]!), `leader ${i + 1} over ${j + 1}`).toBe(false);
          }
        }
      }
      if (scale === 0.411) expect([placed[6], led[7]]).toEqual([null, 1]);
    }
  });

  it('never lays a label over another marker, and hides what has no room', () => {
    const xs = Array.from({ length: 400 }, (_, i) => 24 + (i % 40) * 24);
    const ys = Array.from({ length: 400 }, (_, i) => 24 + Math.floor(i / 40) * 24);
    const input = base(xs, ys, 38);
    const placed = boxes(input, 1);
    expect(placed.some((b) => b === null)).toBe(true);
    for (const b of placed) {
      if (!b) continue;
      for (let m = 0; m < xs.length; m++) expect(overlap(b, [xs[m]! - 12, ys[m]! - 12, 24, 24])).toBe(false);
    }
  });
});
