/**
 * Reads the parts of a section written as plain SPICE element lines. Only what the board map needs (designator,
 * kind, value, pins) is read here; the circuit engine parses the composed netlist itself. Kept free of the
 * circuit package so composing a board in the browser does not load the expression evaluator.
 */
import type { BoardPartKind } from '@splitscope/contract';
import { formatSi } from '../references/decode-marking';
import type { TemplatePart } from '../sections/types';

const SCALE: [string, number][] = [
  ['meg', 1e6],
  ['mil', 25.4e-6],
  ['f', 1e-15],
  ['p', 1e-12],
  ['n', 1e-9],
  ['u', 1e-6],
  ['µ', 1e-6],
  ['m', 1e-3],
  ['k', 1e3],
  ['g', 1e9],
  ['t', 1e12],
];

/** A SPICE value token ("2.2k", "100n", "10meg", "1.5e3") as a number (SPICE3 scale suffixes), else undefined. */
export function spiceValue(token: string | undefined): number | undefined {
  const m = token ? /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)([a-zµ]*)$/i.exec(token.trim()) : null;
  if (!m) return undefined;
  const suffix = (m[2] ?? '').toLowerCase();
  const hit = SCALE.find(([s]) => suffix.startsWith(s));
  return Number(m[1]) * (hit ? hit[1] : 1);
}

const TWO_PIN = new Set(['R', 'C', 'L', 'D', 'V', 'I']);

function kindOf(name: string, letter: string, value: number | undefined, model: string): BoardPartKind {
  if (letter === 'R') return /^RTH/i.test(name) ? 'thermistor' : 'resistor';
  if (letter === 'C') return (value ?? 0) >= 1e-6 ? 'electrolytic-capacitor' : 'ceramic-capacitor';
  if (letter === 'D') return /LED/i.test(model) ? 'led' : 'diode';
  if (letter === 'Q') return 'bjt';
  if (letter === 'X') return 'opto-coupler';
  return 'other';
}

function packageOf(kind: BoardPartKind): string {
  const by: Partial<Record<BoardPartKind, string>> = {
    'electrolytic-capacitor': 'radial-e',
    'opto-coupler': 'dip-4',
    bjt: 'to-92',
    regulator: 'to-220',
    diode: 'do-41',
    led: 'led-3mm',
    thermistor: 'disc-7',
  };
  return by[kind] ?? '0805';
}

export interface SpiceParts {
  parts: TemplatePart[];
  /** Every element name in the fragment, in order (sources included). */
  elements: string[];
}

/** Parts of a SPICE fragment; sources (V, I) and `offBoard` elements are left out of the parts. */
export function spiceParts(text: string, offBoard: readonly string[] = [], kinds: Record<string, BoardPartKind> = {}): SpiceParts {
  const skip = new Set(offBoard.map((e) => e.toUpperCase()));
  const parts: TemplatePart[] = [];
  const elements: string[] = [];
  for (const raw of text.split('\n')) {
    const line = raw.trim();
    if (line === '' || line.startsWith('*') || line.startsWith('.') || line.startsWith('+')) continue;
    const tok = line.split(/\s+/);
    const name = tok[0]!.toUpperCase();
    const letter = name[0]!;
    elements.push(name);
    if (letter === 'V' || letter === 'I' || skip.has(name)) continue;
    const nodeCount = TWO_PIN.has(letter) ? 2 : letter === 'Q' ? 3 : tok.length - 2;
    const nodes = tok.slice(1, 1 + nodeCount).map((n) => n.toLowerCase());
    const valueTok = tok[1 + nodeCount];
    const value = letter === 'R' || letter === 'C' ? spiceValue(valueTok) : undefined;
    const model = value === undefined ? (valueTok ?? '') : '';
    const kind = kinds[name] ?? kindOf(name, letter, value, model);
    const pinNames = letter === 'D' ? ['A', 'K'] : letter === 'Q' ? ['C', 'B', 'E'] : nodes.map((_, i) => String(i + 1));
    const part: TemplatePart = {
      designator: name,
      element: name,
      kind,
      value: value !== undefined ? formatSi(value, letter === 'R' ? 'Ω' : 'F') : model,
      package: packageOf(kind),
      pins: nodes.map((n, i) => ({ pin: pinNames[i] ?? String(i + 1), net: n })),
    };
    if (value !== undefined) part.nominal = value;
    if (letter === 'R') part.tolerance = 0.05;
    if (letter === 'C') part.tolerance = 0.2;
    parts.push(part);
  }
  return { parts, elements };
}
