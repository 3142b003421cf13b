/**
 * Draws a board picture (SVG) from the composed layout: solder mask, copper traces between the pins of each net,
 * part bodies by kind with their designators, connectors with pin labels, test-point pads and silkscreen. The
 * same geometry places the pins the traces run to, so the drawing and the map agree.
 */
import type { BoardModel, BoardSide } from '@splitscope/contract';
import type { ConnectorSpec, Region } from './types';

type Part = BoardModel['parts'][number];
type Pt = { x: number; y: number };

export interface RenderInput {
  width: number;
  height: number;
  colours?: { mask: string; silk: string; copper: string } | undefined;
  title: string;
  sections: { id: string; title: string; side: BoardSide; touchesBus: boolean; region: Region }[];
  parts: Part[];
  connectors: ConnectorSpec[];
  testPoints: { id: string; x: number; y: number }[];
  /** Ground nets are poured copper, not drawn as traces. */
  grounds: string[];
}

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Where pin i of a part sits on the picture. */
export function pinPosition(p: Part, i: number): Pt {
  const n = p.pins.length;
  if (p.kind === 'opto-coupler' && n === 4)
    return [
      { x: p.x - 18, y: p.y - 7 },
      { x: p.x - 18, y: p.y + 7 },
      { x: p.x + 18, y: p.y + 7 },
      { x: p.x + 18, y: p.y - 7 },
    ][i]!;
  if (n === 3) return { x: p.x + (i - 1) * (p.kind === 'regulator' ? 12 : 10), y: p.y + (p.kind === 'regulator' ? 22 : 15) };
  if (n === 2) return { x: p.x + (i === 0 ? -24 : 24), y: p.y };
  return { x: p.x - 12 * (n - 1) + 24 * i, y: p.y + 16 };
}

/** Connector pin i on the picture. */
export function connectorPinPosition(c: ConnectorSpec, i: number): Pt {
  return { x: c.x + 14 + i * 24, y: c.y + 14 };
}

function body(p: Part, silk: string): string {
  const { x, y } = p;
  switch (p.kind) {
    case 'resistor':
    case 'fuse':
      return `<rect x="${x - 15}" y="${y - 6}" width="30" height="12" rx="5" fill="${p.kind === 'fuse' ? '#d9dde0' : '#d8c49a'}" stroke="#4a3b22"/>`;
    case 'electrolytic-capacitor':
      return `<circle cx="${x}" cy="${y}" r="15" fill="#26384f" stroke="${silk}"/><path d="M${x + 9} ${y - 12}A15 15 0 0 1 ${x + 9} ${y + 12}" fill="none" stroke="#c9d3dc" stroke-width="4"/>`;
    case 'ceramic-capacitor':
    case 'film-capacitor':
      return `<rect x="${x - 9}" y="${y - 7}" width="18" height="14" rx="${p.kind === 'film-capacitor' ? 2 : 7}" fill="${p.kind === 'film-capacitor' ? '#b8462f' : '#c98a2e'}" stroke="#3b2a14"/>`;
    case 'diode':
    case 'zener':
      return `<rect x="${x - 13}" y="${y - 5}" width="26" height="10" rx="2" fill="${p.kind === 'zener' ? '#b7432f' : '#222'}"/><rect x="${x + 7}" y="${y - 5}" width="3" height="10" fill="#ddd"/>`;
    case 'led':
      return `<circle cx="${x}" cy="${y}" r="8" fill="#c8302a" stroke="${silk}"/>`;
    case 'thermistor':
      return `<circle cx="${x}" cy="${y}" r="10" fill="#2f5f8a" stroke="${silk}"/>`;
    case 'bjt':
      return `<path d="M${x - 11} ${y + 8}V${y - 2}A11 11 0 0 1 ${x + 11} ${y - 2}V${y + 8}Z" fill="#1d1d1d" stroke="${silk}"/>`;
    case 'regulator':
      return `<rect x="${x - 17}" y="${y - 22}" width="34" height="10" fill="#b9bec4"/><rect x="${x - 17}" y="${y - 12}" width="34" height="26" fill="#1d1d1d" stroke="${silk}"/>`;
    case 'opto-coupler':
      return `<rect x="${x - 13}" y="${y - 12}" width="26" height="24" rx="2" fill="#1d1d1d" stroke="${silk}"/><circle cx="${x - 7}" cy="${y - 6}" r="2" fill="${silk}"/>`;
    default:
      return `<rect x="${x - 14}" y="${y - 10}" width="28" height="20" fill="#1d1d1d" stroke="${silk}"/>`;
  }
}

function traces(input: RenderInput, copper: string): string {
  const pts = new Map<string, Pt[]>();
  const add = (net: string, pt: Pt) => {
    if (input.grounds.includes(net)) return;
    pts.set(net, [...(pts.get(net) ?? []), pt]);
  };
  for (const p of input.parts) p.pins.forEach((pin, i) => add(pin.net, pinPosition(p, i)));
  for (const c of input.connectors) c.pins.forEach((pin, i) => add(pin.net, connectorPinPosition(c, i)));
  let out = '';
  for (const list of pts.values()) {
    const sorted = [...list].sort((a, b) => a.x - b.x || a.y - b.y);
    for (let i = 1; i < sorted.length; i++) {
      const a = sorted[i - 1]!,
        b = sorted[i]!;
      // Manhattan routing: down/up from the first pin to a lane, across, then to the second pin.
      const lane = Math.round((a.y + b.y) / 2);
      out += `<path d="M${a.x} ${a.y}V${lane}H${b.x}V${b.y}" fill="none" stroke="${copper}" stroke-width="3" stroke-linejoin="round" stroke-opacity="0.85"/>`;
    }
  }
  return out;
}

function pads(input: RenderInput, isGround: (net: string) => boolean): string {
  let out = '';
  for (const p of input.parts) {
    p.pins.forEach((pin, i) => {
      const { x, y } = pinPosition(p, i);
      out += `<circle cx="${x}" cy="${y}" r="3.5" fill="#d8b36a" stroke="${isGround(pin.net) ? '#0d2418' : 'none'}"/>`;
    });
  }
  return out;
}

function connector(c: ConnectorSpec, silk: string): string {
  const w = 28 + (c.pins.length - 1) * 24;
  let out = `<rect x="${c.x}" y="${c.y}" width="${w}" height="28" rx="3" fill="#f1efe6" stroke="#333"/>`;
  out += `<text x="${c.x}" y="${c.y - 8}" font-family="sans-serif" font-size="13" fill="${silk}">${esc(c.name)}${c.title ? ` ${esc(c.title)}` : ''}</text>`;
  c.pins.forEach((pin, i) => {
    const { x, y } = connectorPinPosition(c, i);
    out += `<rect x="${x - 7}" y="${y - 7}" width="14" height="14" fill="#d8b36a" stroke="#555"/>`;
    out += `<text x="${x}" y="${y + 4}" text-anchor="middle" font-family="sans-serif" font-size="9" fill="#222">${esc(pin.pin)}</text>`;
    out += `<text transform="translate(${x - 2} ${c.y + 40}) rotate(40)" font-family="sans-serif" font-size="10" fill="${silk}">${esc(pin.function)}</text>`;
  });
  return out;
}

/** The board picture as an SVG document. */
export function renderBoardSvg(input: RenderInput): string {
  const { width: W, height: H } = input;
  const { mask, silk, copper } = input.colours ?? { mask: '#1f5a3a', silk: '#f3f7ef', copper: '#c58b3a' };
  const sections = input.sections
    .map(({ region: r, title, touchesBus, side }) => {
      const warn = touchesBus
        ? `<path d="M${r.x + r.w - 30} ${r.y + 28}l10 -18l10 18z" fill="none" stroke="${silk}" stroke-width="2"/><text x="${r.x + r.w - 20}" y="${r.y + 25}" text-anchor="middle" font-family="sans-serif" font-size="10" font-weight="bold" fill="${silk}">!</text>`
        : '';
      return (
        `<rect x="${r.x}" y="${r.y}" width="${r.w}" height="${r.h}" rx="8" fill="none" stroke="${silk}" stroke-opacity="0.45" stroke-dasharray="${side === 'hot' ? '8 5' : '2 4'}"/>` +
        `<text x="${r.x + 10}" y="${r.y + 22}" font-family="sans-serif" font-size="15" fill="${silk}">${esc(title)}${side === 'cold' ? ' (cold side)' : ''}</text>` +
        warn
      );
    })
    .join('');
  const labels = input.parts
    .map(
      (p) =>
        `<text x="${p.x}" y="${p.y + (p.pins.length === 3 ? 40 : 27)}" text-anchor="middle" font-family="sans-serif" font-size="11" fill="${silk}">${esc(p.designator)}</text>`,
    )
    .join('');
  const tps = input.testPoints
    .map(
      (t) =>
        `<circle cx="${t.x}" cy="${t.y}" r="6" fill="#e3c27a" stroke="${silk}" stroke-width="1.5"/><text x="${t.x + 9}" y="${t.y - 6}" font-family="sans-serif" font-size="10" fill="${silk}">${esc(t.id)}</text>`,
    )
    .join('');
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">` +
    `<rect width="${W}" height="${H}" rx="22" fill="${mask}"/>` +
    [
      [24, 24],
      [W - 24, 24],
      [24, H - 24],
      [W - 24, H - 24],
    ]
      .map(([x, y]) => `<circle cx="${x}" cy="${y}" r="9" fill="#0d2418" stroke="#d8b36a" stroke-width="3"/>`)
      .join('') +
    traces(input, copper) +
    sections +
    pads(input, (n) => input.grounds.includes(n)) +
    input.parts.map((p) => body(p, silk)).join('') +
    labels +
    input.connectors.map((c) => connector(c, silk)).join('') +
    tps +
    `<text x="${W / 2}" y="40" text-anchor="middle" font-family="sans-serif" font-size="15" fill="${silk}">${esc(input.title)}</text>` +
    `</svg>`
  );
}
