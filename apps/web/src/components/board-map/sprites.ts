import { MARKER, markerPoints, type MarkerState } from '@/lib/map-geometry';

/**
 * Markers and labels as small pre-drawn bitmaps. Without a GPU the canvas rasterises every arc, stroke and glyph
 * on the main thread each frame; copying a bitmap to a whole pixel costs a fraction of that, and markers and
 * labels keep their size on screen, so one bitmap per marker state and per label serves every zoom.
 */

export const R = 10;
export const SPRITE = 24; // css px, the marker with its ring and a little room
export const LABEL_FONT = 'bold 13px Arial';
const PROBE_FONT = '11px Arial';
export const LINE = 15;

function canvas(w: number, h: number, pr: number): [HTMLCanvasElement, CanvasRenderingContext2D] | null {
  const c = document.createElement('canvas');
  c.width = Math.max(1, Math.ceil(w * pr));
  c.height = Math.max(1, Math.ceil(h * pr));
  const ctx = c.getContext('2d');
  if (!ctx) return null;
  ctx.scale(pr, pr);
  return [c, ctx];
}

const markers = new Map<string, HTMLCanvasElement | null>();

export function markerSprite(state: MarkerState, pr: number): HTMLCanvasElement | null {
  const key = `${state}@${pr}`;
  if (markers.has(key)) return markers.get(key)!;
  const made = canvas(SPRITE, SPRITE, pr);
  if (made) {
    const [, ctx] = made;
    const m = MARKER[state];
    ctx.translate(SPRITE / 2, SPRITE / 2);
    ctx.beginPath();
    ctx.arc(0, 0, R, 0, Math.PI * 2);
    ctx.fillStyle = '#ffffff';
    ctx.fill();
    ctx.lineWidth = 3;
    ctx.strokeStyle = m.colour;
    ctx.stroke();
    if (m.shape !== 'ring') {
      const g = markerPoints(m.shape, R * 0.75);
      ctx.beginPath();
      ctx.moveTo(g[0]!, g[1]!);
      for (let j = 2; j < g.length; j += 2) ctx.lineTo(g[j]!, g[j + 1]!);
      if (m.shape !== 'check') ctx.closePath();
      ctx.lineJoin = 'round';
      ctx.lineCap = 'round';
      ctx.fillStyle = m.colour;
      if (m.shape !== 'check') ctx.fill();
      ctx.lineWidth = m.shape === 'check' ? 3 : 1;
      ctx.stroke();
    }
  }
  markers.set(key, made?.[0] ?? null);
  return made?.[0] ?? null;
}

const labels = new Map<string, HTMLCanvasElement | null>();

/** A label's bitmap: the name, and under it the probe tag when a probe goes there. */
export function labelSprite(text: string, tag: string | null, w: number, h: number, pr: number): HTMLCanvasElement | null {
  const key = `${text}\u0000${tag ?? ''}@${pr}`;
  if (labels.has(key)) return labels.get(key)!;
  // Bounded: an editor renaming points for an hour must not grow this without end.
  if (labels.size > 5000) labels.clear();
  const made = canvas(w, h, pr);
  if (made) {
    const [, ctx] = made;
    ctx.fillStyle = '#ffffff';
    ctx.textBaseline = 'top';
    ctx.font = LABEL_FONT;
    ctx.fillText(text, 0, 1);
    if (tag) {
      ctx.font = PROBE_FONT;
      ctx.fillText(tag, 0, LINE + 1);
    }
  }
  labels.set(key, made?.[0] ?? null);
  return made?.[0] ?? null;
}
