import type { View } from '@/lib/map-geometry';
import { LABEL_FONT, LINE, R, SPRITE, labelSprite, markerSprite } from './sprites';
import { forcedPlace, layoutLabels, placedWidth, type LabelInput, type LabelLayout } from './label-layout';
import type { MapConnector, MapPart, MapPoint } from './types';

/**
 * The interactive overlay drawn straight onto the canvas in screen pixels. A thousand markers as Konva nodes cost
 * more per frame than the canvas work itself, so markers and labels are copied from pre-drawn bitmaps, and
 * only the ones on screen. Nothing here allocates per frame; the label layout is redone only when the scale changes.
 */

export const PROBE = { red: '#c81e1e', black: '#111827' } as const;
export { LABEL_FONT };
const PROBE_FONT = '11px Arial';

export interface OverlayScene {
  board: { width: number; height: number };
  /** The board picture, already rasterised. */
  picture: HTMLCanvasElement | null;
  points: MapPoint[];
  parts: MapPart[];
  connectors: MapConnector[];
  selectedId: string | null;
  highlightPart: string | null;
  probes: { red?: string; black?: string };
  hoverNet: string | null;
  hoverPoint: number;
  /** A point being dragged in the editor: its index and board position. */
  drag: { i: number; x: number; y: number } | null;
  labels: LabelInput;
  layout: LabelLayout | null;
}

const probeOf = (s: OverlayScene, net: string) => (s.probes.red === net ? 'red' : s.probes.black === net ? 'black' : null);
const lit = (s: OverlayScene, net: string) => s.hoverNet === net || s.probes.red === net || s.probes.black === net;

export function drawOverlay(ctx: CanvasRenderingContext2D, s: OverlayScene, v: View, width: number, height: number, pr: number) {
  const k = v.scale;
  const px = (x: number) => x * k + v.x;
  const py = (y: number) => y * k + v.y;
  const pts = s.points;
  const n = pts.length;
  const on = (x: number, y: number, pad: number) => x > -pad && y > -pad && x < width + pad && y < height + pad;
  const pos = (i: number, axis: 'x' | 'y') => (s.drag && s.drag.i === i ? s.drag[axis] : pts[i]![axis]);

  // the board and its picture, in board coordinates: one canvas for everything is one less to clear and composite
  ctx.setTransform(pr * k, 0, 0, pr * k, pr * v.x, pr * v.y);
  ctx.beginPath();
  ctx.roundRect(0, 0, s.board.width, s.board.height, 8);
  ctx.fillStyle = '#1f5f4a';
  ctx.fill();
  if (s.picture) ctx.drawImage(s.picture, 0, 0, s.board.width, s.board.height);
  ctx.setTransform(pr, 0, 0, pr, 0, 0);

  // parts: thin dashed outlines, the picked one bold and named
  ctx.beginPath();
  for (const p of s.parts) if (p.id !== s.highlightPart) ctx.rect(px(p.x), py(p.y), p.width * k, p.height * k);
  ctx.setLineDash([4, 4]);
  ctx.lineWidth = 1;
  ctx.strokeStyle = 'rgba(255,255,255,0.35)';
  ctx.stroke();
  ctx.setLineDash([]);
  const hp = s.highlightPart ? s.parts.find((p) => p.id === s.highlightPart) : undefined;
  if (hp) {
    ctx.lineWidth = 4;
    ctx.strokeStyle = '#f5c542';
    ctx.strokeRect(px(hp.x), py(hp.y), hp.width * k, hp.height * k);
    ctx.font = 'bold 16px Arial';
    ctx.fillStyle = '#f5c542';
    ctx.textBaseline = 'top';
    ctx.fillText(hp.id, px(hp.x), py(hp.y) - 20);
  }

  // connectors: name above, pins as squares in the net's colour
  ctx.textBaseline = 'top';
  for (const c of s.connectors) {
    ctx.font = 'bold 13px Arial';
    ctx.fillStyle = '#ffffff';
    ctx.fillText(c.id, px(c.x), py(c.y) - 18);
    for (const pin of c.pins) {
      const probe = probeOf(s, pin.net);
      ctx.fillStyle = probe ? PROBE[probe] : lit(s, pin.net) ? '#f5c542' : '#d6a756';
      ctx.fillRect(px(pin.x) - 7, py(pin.y) - 7, 14, 14);
      ctx.lineWidth = 1;
      ctx.strokeStyle = '#111827';
      ctx.strokeRect(px(pin.x) - 7, py(pin.y) - 7, 14, 14);
      ctx.font = '11px Arial';
      ctx.fillStyle = '#ffffff';
      ctx.fillText(pin.label, px(pin.x) + 9, py(pin.y) - 6);
    }
  }

  // rings under the lit (hovered net, probed) and the selected markers
  for (let i = 0; i < n; i++) {
    const p = pts[i]!;
    if (!(p.id === s.selectedId || lit(s, p.net))) continue;
    const probe = probeOf(s, p.net);
    ctx.beginPath();
    ctx.arc(px(pos(i, 'x')), py(pos(i, 'y')), 16, 0, Math.PI * 2);
    ctx.lineWidth = 4;
    ctx.strokeStyle = probe ? PROBE[probe] : '#f5c542';
    ctx.stroke();
  }

  // markers: one pre-drawn bitmap per state, copied to whole device pixels, only those on screen
  const snap = (c: number) => Math.round(c * pr) / pr;
  for (let i = 0; i < n; i++) {
    const x = px(pos(i, 'x'));
    const y = py(pos(i, 'y'));
    if (!on(x, y, SPRITE)) continue;
    const img = markerSprite(pts[i]!.state, pr);
    if (img) ctx.drawImage(img, snap(x - SPRITE / 2), snap(y - SPRITE / 2), SPRITE, SPRITE);
  }

  // labels where the layout found room; the selected and hovered points' labels always, on a backing
  if (!s.layout || s.layout.scale !== k) s.layout = layoutLabels(s.labels, k);
  const { dx, dy, led, short } = s.layout;
  const { widths, heights } = s.labels;
  const boxWidth = (i: number) => placedWidth(s.labels, s.layout!, i);
  // leader lines, from the marker's edge to the nearest point of a label a row or more away, under the labels
  ctx.beginPath();
  for (let i = 0; i < n; i++) {
    if (!led[i] || (s.drag !== null && s.drag.i === i)) continue;
    const x = px(pts[i]!.x);
    const y = py(pts[i]!.y);
    if (!on(x, y, 300)) continue;
    const ex = Math.max(x + dx[i]!, Math.min(x + dx[i]! + boxWidth(i), x));
    const ey = Math.max(y + dy[i]!, Math.min(y + dy[i]! + heights[i]!, y));
    const len = Math.hypot(ex - x, ey - y) || 1;
    ctx.moveTo(x + ((ex - x) * R) / len, y + ((ey - y) * R) / len);
    ctx.lineTo(ex, ey);
  }
  ctx.lineWidth = 1.5;
  ctx.strokeStyle = 'rgba(255,255,255,0.8)';
  ctx.stroke();
  for (let i = 0; i < n; i++) {
    const p = pts[i]!;
    let ox = dx[i]!;
    let oy = dy[i]!;
    const x = px(pos(i, 'x'));
    const y = py(pos(i, 'y'));
    if (!on(x, y, 300)) continue;
    if (Number.isNaN(ox)) {
      const forced = p.id === s.selectedId || i === s.hoverPoint || (s.drag !== null && s.drag.i === i);
      if (!forced) continue;
      [ox, oy] = forcedPlace(s.labels, i, k);
      ctx.fillStyle = 'rgba(17,24,39,0.85)';
      ctx.fillRect(x + ox - 2, y + oy - 1, widths[i]! + 4, heights[i]! + 2);
    }
    const probe = probeOf(s, p.net);
    const placedShort = short[i] === 1 && !Number.isNaN(dx[i]!);
    const w = placedShort ? boxWidth(i) : widths[i]!;
    const img = labelSprite(placedShort ? p.id : p.label, probe ? PROBE_TAG[probe] : null, w, heights[i]!, pr);
    if (img) ctx.drawImage(img, snap(x + ox), snap(y + oy), w, heights[i]!);
  }
}

export const PROBE_TAG = { red: 'RED +', black: 'BLACK −' } as const;

/** Label box widths: the wider of the name (or, for the short form, the point's id) and, where a probe goes, its tag. */
export function labelWidths(
  points: MapPoint[],
  probes: { red?: string; black?: string },
  measure: (text: string, font: string) => number,
  text: (p: MapPoint) => string = (p) => p.label,
): Float32Array {
  return Float32Array.from(points, (p) => {
    const tag = p.net === probes.red ? PROBE_TAG.red : p.net === probes.black ? PROBE_TAG.black : null;
    return Math.max(measure(text(p), LABEL_FONT), tag ? measure(tag, PROBE_FONT) : 0);
  });
}

/** The short form of a point's label: its id as printed on the board (TP7). */
export const shortLabel = (p: MapPoint) => p.id;

/** Label box heights: one line, two where a probe tag goes under the name. */
export function labelHeights(points: MapPoint[], probes: { red?: string; black?: string }): Float32Array {
  return Float32Array.from(points, (p) => (p.net === probes.red || p.net === probes.black ? LINE + 13 : LINE));
}

/** Connector names, pins and pin labels as fixed obstacles for the label layout. */
export function connectorObstacles(connectors: MapConnector[], measure: (text: string, font: string) => number): LabelInput['obstacles'] {
  return connectors.flatMap((c) => [
    { x: c.x, y: c.y, dx: 0, dy: -18, w: measure(c.id, 'bold 13px Arial'), h: LINE },
    ...c.pins.map((p) => ({ x: p.x, y: p.y, dx: -7, dy: -7, w: 16 + measure(p.label, '11px Arial'), h: 14 })),
  ]);
}
