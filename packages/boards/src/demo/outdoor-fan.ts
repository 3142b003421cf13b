// The outdoor fan-drive demo board: an invented maker ("Fjordline") and an invented board. Parts come from the
// netlist, laid out by section on a drawn board picture; test points are placed beside the parts they touch.
import { BOARD_MODEL_SCHEMA_VERSION, boardModelSchema, type BoardModel, type BoardPartKind } from '@splitscope/contract';
import { parseNetlist, parseSpiceNumber } from '@splitscope/circuit';
import { OUTDOOR_FAN_NETLIST } from './netlist';

const W = 1200;
const H = 800;

interface SectionLayout {
  id: string;
  title: string;
  touchesBus: boolean;
  x: number;
  y: number;
  w: number;
  h: number;
  parts: string[];
}

const SECTIONS: SectionLayout[] = [
  { id: 'bus', title: 'DC bus', touchesBus: true, x: 40, y: 60, w: 340, h: 300, parts: ['VBUS', 'C1', 'R1', 'R2', 'R3', 'R4', 'C2', 'R34', 'C19'] },
  { id: 'reg15', title: '15 V regulator', touchesBus: false, x: 420, y: 60, w: 340, h: 300, parts: ['VAUX', 'D1', 'C3', 'C4', 'R35', 'XVREG', 'C5', 'C6', 'R5', 'D2', 'V5', 'C7', 'C20'] },
  { id: 'fan-switch', title: 'Fan supply switch', touchesBus: false, x: 800, y: 60, w: 360, h: 300, parts: ['VCMD', 'R6', 'XU1', 'R7', 'R8', 'Q1', 'C8', 'C9', 'C10', 'D3', 'R9', 'RLOAD'] },
  { id: 'speed-cmd', title: 'Speed command', touchesBus: false, x: 40, y: 420, w: 380, h: 320, parts: ['VSPD', 'R17', 'R18', 'Q2', 'R19', 'R21', 'Q3', 'R22', 'R23', 'C12', 'C13', 'R24'] },
  { id: 'feedback', title: 'Speed feedback', touchesBus: false, x: 460, y: 420, w: 320, h: 320, parts: ['R12', 'XU2', 'R13', 'R14', 'R15', 'C11', 'R16'] },
  { id: 'logic', title: 'Controller I/O', touchesBus: false, x: 820, y: 420, w: 340, h: 320, parts: ['R25', 'C14', 'R26', 'R27', 'R28', 'RTH1', 'C15', 'R29', 'C16', 'VIO5', 'R32', 'R33', 'Q4', 'RRLY', 'D5'] },
];

// Sources stand for what is off the board or behind a connector (mains, the auxiliary supply, the controller).
const OFF_BOARD = new Set(['VBUS', 'VAUX', 'V5', 'VCMD', 'VSPD', 'VIO5', 'RLOAD']);

const TEST_POINTS: { id: string; net: string; label: string; section: string; near: string }[] = [
  { id: 'TP1', net: 'bus', label: 'DC bus +', section: 'bus', near: 'C1' },
  { id: 'TP2', net: 'aux1', label: 'Regulator input', section: 'reg15', near: 'C3' },
  { id: 'TP3', net: 'v15', label: '15 V rail', section: 'reg15', near: 'C5' },
  { id: 'TP4', net: 'v5', label: '5 V logic', section: 'reg15', near: 'C7' },
  { id: 'TP5', net: 'vfan', label: 'Fan control supply (VFAN)', section: 'fan-switch', near: 'C8' },
  { id: 'TP6', net: 'b1', label: 'Switch base', section: 'fan-switch', near: 'R7' },
  { id: 'TP7', net: 'oc', label: 'Drive opto collector', section: 'fan-switch', near: 'XU1' },
  { id: 'TP8', net: 'la', label: 'Drive opto LED anode', section: 'fan-switch', near: 'R6' },
  { id: 'TP9', net: 'vsp', label: 'Speed command (VSP)', section: 'speed-cmd', near: 'C12' },
  { id: 'TP10', net: 'fbc', label: 'Feedback opto output', section: 'feedback', near: 'R14' },
  { id: 'TP11', net: 'th1', label: 'Thermistor divider', section: 'logic', near: 'RTH1' },
  { id: 'TP12', net: 'rl', label: 'Relay driver collector', section: 'logic', near: 'Q4' },
];

function kindOf(name: string, letter: string, value: number | undefined, model?: string): BoardPartKind {
  if (name.startsWith('RTH')) return 'thermistor';
  if (letter === 'R') return 'resistor';
  if (letter === 'C') return (value ?? 0) >= 1e-6 ? 'electrolytic-capacitor' : 'ceramic-capacitor';
  if (letter === 'D') return model === 'DLED' ? 'led' : 'diode';
  if (letter === 'Q') return 'bjt';
  if (letter === 'X') return name === 'XVREG' ? 'regulator' : 'opto-coupler';
  return 'other';
}

function formatValue(v: number | undefined, unit: string): string {
  if (v === undefined) return '';
  const steps: [number, string][] = [[1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p']];
  for (const [s, p] of steps) if (Math.abs(v) >= s) return `${Number((v / s).toPrecision(3))} ${p}${unit}`;
  return `${v} ${unit}`;
}

function numeric(v: unknown): number | undefined {
  if (typeof v === 'number') return v;
  if (typeof v !== 'string' || v.includes('{')) return undefined;
  try {
    return parseSpiceNumber(v);
  } catch {
    return undefined;
  }
}

function layout() {
  const netlist = parseNetlist(OUTDOOR_FAN_NETLIST);
  const byName = new Map(netlist.elements.map((e) => [e.name.toUpperCase(), e]));
  const pos = new Map<string, { x: number; y: number; section: string }>();
  for (const s of SECTIONS) {
    const onBoard = s.parts.filter((p) => !OFF_BOARD.has(p));
    const cols = 4;
    onBoard.forEach((p, i) => {
      pos.set(p, { x: s.x + 50 + (i % cols) * ((s.w - 80) / (cols - 1 || 1)), y: s.y + 70 + Math.floor(i / cols) * 62, section: s.id });
    });
  }
  const parts = [...pos.entries()].map(([designator, p]) => {
    const e = byName.get(designator)!;
    const letter = designator[0]!;
    const num = numeric(e.value);
    const unit = letter === 'R' ? 'Ω' : letter === 'C' ? 'F' : '';
    const model = 'model' in e ? String((e as { model?: string }).model ?? '') : '';
    return {
      designator,
      element: designator,
      kind: kindOf(designator, letter, num, model.toUpperCase()),
      value: num !== undefined ? formatValue(num, unit) : model || (letter === 'X' ? 'opto' : ''),
      ...(num !== undefined ? { nominal: num } : {}),
      tolerance: letter === 'R' ? 0.05 : letter === 'C' ? 0.2 : undefined,
      package: letter === 'C' && (num ?? 0) >= 1e-6 ? 'radial' : letter === 'X' ? 'DIP-4' : letter === 'Q' ? 'TO-92' : '0805',
      x: Math.round(p.x),
      y: Math.round(p.y),
      rotation: 0,
      section: p.section,
      side: 'hot' as const,
      pins: e.nodes.map((n, i) => ({ pin: String(i + 1), net: n.toLowerCase() })),
    };
  });
  return { parts, pos };
}

function picture(parts: { designator: string; x: number; y: number }[]): string {
  const rects = SECTIONS.map(
    (s) =>
      `<rect x="${s.x}" y="${s.y}" width="${s.w}" height="${s.h}" rx="10" fill="none" stroke="#e8f1e4" stroke-opacity="0.35" stroke-dasharray="8 6"/>` +
      `<text x="${s.x + 12}" y="${s.y + 26}" font-family="sans-serif" font-size="18" fill="#f3f7ef">${s.title}</text>`,
  ).join('');
  const traces = parts
    .map((p, i) => (i > 0 ? `<line x1="${parts[i - 1]!.x}" y1="${parts[i - 1]!.y}" x2="${p.x}" y2="${p.y}" stroke="#c58b3a" stroke-opacity="0.55" stroke-width="5"/>` : ''))
    .join('');
  const bodies = parts
    .map(
      (p) =>
        `<rect x="${p.x - 18}" y="${p.y - 10}" width="36" height="20" rx="3" fill="#20302c" stroke="#d9d4c5"/>` +
        `<circle cx="${p.x - 24}" cy="${p.y}" r="4" fill="#d8b36a"/><circle cx="${p.x + 24}" cy="${p.y}" r="4" fill="#d8b36a"/>` +
        `<text x="${p.x}" y="${p.y + 28}" text-anchor="middle" font-family="sans-serif" font-size="12" fill="#f3f7ef">${p.designator}</text>`,
    )
    .join('');
  const connectors =
    `<rect x="1040" y="748" width="120" height="36" fill="#f1efe6" stroke="#333"/><text x="1100" y="772" text-anchor="middle" font-family="sans-serif" font-size="14">CN3 FAN</text>` +
    `<rect x="40" y="748" width="120" height="36" fill="#f1efe6" stroke="#333"/><text x="100" y="772" text-anchor="middle" font-family="sans-serif" font-size="14">CN1 DC BUS</text>`;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">` +
    `<rect width="${W}" height="${H}" rx="24" fill="#1f5a3a"/>` +
    `<circle cx="24" cy="24" r="9" fill="#0d2418"/><circle cx="${W - 24}" cy="24" r="9" fill="#0d2418"/>` +
    traces +
    rects +
    bodies +
    connectors +
    `<text x="${W - 20}" y="40" text-anchor="end" font-family="sans-serif" font-size="16" fill="#f3f7ef">FJORDLINE OFD-220 rev B (demo)</text>` +
    `</svg>`
  );
}

function build(): BoardModel {
  const { parts, pos } = layout();
  const testPoints = TEST_POINTS.map((t) => {
    const p = pos.get(t.near)!;
    // Every point of this board is on the hot side, referenced to bus negative with the bulk capacitor in reach:
    // an unpowered test anywhere here needs the bus discharged first (common practice).
    const touchesBus = true;
    return {
      id: t.id,
      label: t.label,
      net: t.net,
      reference: '0',
      x: Math.round(p.x + 30),
      y: Math.round(p.y - 22),
      powerStates: ['on', 'off'] as ('on' | 'off')[],
      modes: ['dcv', 'ohm', 'diode', 'continuity'] as ('dcv' | 'ohm' | 'diode' | 'continuity')[],
      section: t.section,
      touchesBus,
      side: 'hot' as const,
    };
  });
  const faultCodes = [
    { code: 'F7', meaning: 'Outdoor fan motor: no speed feedback after start command (invented code)', suspectSections: ['fan-switch', 'feedback', 'speed-cmd'] },
    { code: 'F3', meaning: 'DC bus voltage out of range (invented code)', suspectSections: ['bus'] },
    { code: 'F9', meaning: 'Outdoor coil thermistor open or shorted (invented code)', suspectSections: ['logic'] },
  ];
  return boardModelSchema.parse({
    schemaVersion: BOARD_MODEL_SCHEMA_VERSION,
    id: 'demo-ofd-220',
    slug: 'fjordline-ofd-220',
    name: 'Fjordline OFD-220 outdoor fan drive',
    family: 'Fjordline OFD outdoor boards',
    maker: 'Fjordline (invented demo maker)',
    description: 'Invented demo board: DC bus, 15 V regulator, opto-driven PNP fan-supply switch, speed command and feedback.',
    picture: { svg: picture(parts), width: W, height: H, units: 'px' },
    sections: SECTIONS.map((s) => ({ id: s.id, template: s.id, params: {}, side: 'hot', title: s.title, touchesBus: s.touchesBus })),
    netlist: OUTDOOR_FAN_NETLIST,
    params: { FAN_ON: 1, SPEED: 0.6 },
    parts,
    nets: TEST_POINTS.map((t) => ({ name: t.net, label: t.label, side: 'hot', reference: '0' })),
    connectors: [
      { name: 'CN1', x: 60, y: 720, title: 'DC bus in', pins: [{ pin: '1', net: 'bus', function: 'Bus +' }, { pin: '2', net: '0', function: 'Bus −' }] },
      { name: 'CN3', x: 1060, y: 720, title: 'Fan motor', pins: [{ pin: '1', net: 'vfan', function: '15 V control supply' }, { pin: '2', net: 'vsp', function: 'Speed command' }, { pin: '3', net: 'fgk', function: 'Speed pulses' }, { pin: '4', net: '0', function: 'Ground' }] },
    ],
    testPoints,
    faultCodes,
    motor: { connector: 'CN3', pulsesPerRevolution: 4, elements: ['RLOAD', 'R13'], note: 'Pulses per revolution of the invented demo motor' },
    cautions: [
      'Mains and the ~300 V DC bus can kill. Unplug the board and measure the bus below the safe threshold before any unpowered test; follow local codes and licensed practice.',
    ],
  });
}

/** The outdoor fan-drive demo board document (validated against the contract's board-model schema). */
export const OUTDOOR_FAN_BOARD: BoardModel = build();
export const DEMO_BOARDS: BoardModel[] = [OUTDOOR_FAN_BOARD];
