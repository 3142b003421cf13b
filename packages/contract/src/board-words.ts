// The bench's words for what the engines name by their internals: a netlist element becomes the designator
// printed on the board ("XU1" → "U1"), a fault mode id becomes words ("dl:open" → "LED open"), and a net
// becomes where a probe goes (a test point, a connector pin, or the nearest part pin: "C10 +"). Written once:
// the server words the diagnosis with it and the screens word stored readings with it.
import type { BoardModel } from './board-model';

type WordsModel = Pick<BoardModel, 'parts' | 'testPoints' | 'connectors' | 'nets'>;

/** The meter functions as the dial says them. */
export const METER_WORDS: Record<'dcv' | 'ohm' | 'diode' | 'continuity', string> = { dcv: 'DC V', ohm: 'Ω', diode: 'diode', continuity: 'continuity' };

const KIND_WORDS: Record<string, string> = {
  resistor: 'resistor',
  'ceramic-capacitor': 'capacitor',
  'electrolytic-capacitor': 'capacitor',
  'film-capacitor': 'capacitor',
  diode: 'diode',
  led: 'LED',
  zener: 'zener',
  bjt: 'transistor',
  'opto-coupler': 'opto',
  regulator: 'regulator',
  connector: 'connector',
  fuse: 'fuse',
  thermistor: 'thermistor',
  ic: 'IC',
};

/** A mode's own name in words (the engine's fault templates: open, short, drift, leaky, transistor and regulator modes). */
const MODE_WORDS: Record<string, string> = {
  open: 'open',
  short: 'shorted',
  drift: 'drifted in value',
  leaky: 'leaky',
  'ce-short': 'collector–emitter short',
  'be-short': 'base–emitter short',
  'be-open': 'base–emitter open',
  'bc-open': 'base–collector open',
  dead: 'dead (no output)',
  'out-short': 'output shorted to ground',
  'in-out-short': 'input shorted to output',
};

/** An internal element of a part's model by its letter: what that piece of the part is called at the bench. */
function innerWord(inner: string, kind: string | undefined): string {
  const l = inner.toLowerCase();
  if (l.startsWith('dz')) return 'zener';
  if (l.startsWith('d')) return kind === 'opto-coupler' ? 'LED' : 'diode';
  if (l.startsWith('q')) return kind === 'opto-coupler' ? 'output transistor' : 'transistor';
  if (l.startsWith('f') || l.startsWith('g') || l.startsWith('e') || l.startsWith('h')) return 'current transfer';
  if (l.startsWith('r')) return 'internal resistor';
  if (l.startsWith('c')) return 'internal capacitor';
  return 'internal part';
}

/** A fault mode id in words: "dl:open" → "LED open", "q1:be-open" → "transistor base–emitter open", "short" → "shorted". */
export function modeWords(mode: string, kind?: string): string {
  const i = mode.indexOf(':');
  if (i < 0) return MODE_WORDS[mode] ?? mode.replace(/-/g, ' ');
  const inner = innerWord(mode.slice(0, i), kind);
  const rest = mode.slice(i + 1);
  if (inner === 'current transfer')
    return rest === 'open'
      ? 'no output (current transfer lost)'
      : rest === 'drift'
        ? 'weak (current transfer low)'
        : `current transfer ${MODE_WORDS[rest] ?? rest}`;
  return `${inner} ${MODE_WORDS[rest] ?? rest.replace(/-/g, ' ')}`;
}

export interface BoardWords {
  /** The designator printed on the board for a netlist element or part name ("XU1" → "U1"). */
  designator(element: string): string;
  /** The part's kind in words ("opto", "capacitor"), if the board model says. */
  kind(element: string): string | undefined;
  /** A fault in words: "U1 opto — LED open", "C10 capacitor — shorted". */
  fault(element: string, mode: string): string;
  /** Where a probe goes for a test point id or a net: "TP3 15 V rail", "CN3 pin 3", "C10 +". */
  probe(netOrPoint: string): string;
  /**
   * Where a reading's probes were: "TP5 Fan control supply to bus negative"; for a lifted part measured on its
   * own pins "C10 alone" (a two-pin part), or "U1 alone, pin 1 to pin 2" where the pins matter.
   */
  probes(r: { red: string; black: string; alone?: string | null }): string;
}

const lower = (s: string) => s.trim().toLowerCase();

const PIN_WORDS: Record<string, string> = { a: 'anode', k: 'cathode', c: 'collector', b: 'base', e: 'emitter' };
/** A part pin as the silkscreen and the trade say it: an electrolytic's + and −, a diode's anode, a transistor's base. */
export function pinWord(kind: string, pin: string): string {
  if (kind === 'electrolytic-capacitor' && (pin === '1' || pin === '2')) return pin === '1' ? '+' : '−';
  const named = PIN_WORDS[lower(pin)];
  if (named && (kind === 'diode' || kind === 'led' || kind === 'zener' || kind === 'bjt')) return named;
  return `pin ${pin}`;
}

/** The words of one board model; `null` (a document that cannot be read) gives neutral words, never internals. */
export function boardWords(model: WordsModel | null): BoardWords {
  const parts = model?.parts ?? [];
  const byElement = new Map<string, (typeof parts)[number]>();
  for (const p of parts) {
    byElement.set(lower(p.designator), p);
    if (p.element) byElement.set(lower(p.element), p);
  }
  const partOf = (element: string) => byElement.get(lower(element)) ?? (/^x/i.test(element) ? byElement.get(lower(element.slice(1))) : undefined);
  // SPICE names a subcircuit instance "X…": the board prints the part without it (XU1 is U1), also where a
  // board model copied the element name into the designator.
  const unX = (name: string) => (/^x[a-z]+\d*$/i.test(name) ? name.slice(1).toUpperCase() : name);
  const designator = (element: string) => {
    const p = partOf(element);
    if (!p) return unX(element.toUpperCase());
    return p.element && lower(p.designator) === lower(p.element) ? unX(p.designator) : p.designator;
  };
  const kind = (element: string) => {
    const k = partOf(element)?.kind;
    return k ? KIND_WORDS[k] : undefined;
  };

  const points = model?.testPoints ?? [];
  const pointById = new Map(points.map((t) => [lower(t.id), t]));
  const pointByNet = new Map<string, (typeof points)[number]>();
  for (const t of points) if (!pointByNet.has(lower(t.net))) pointByNet.set(lower(t.net), t);
  const pinByNet = new Map<string, string>();
  for (const c of model?.connectors ?? []) for (const p of c.pins) if (!pinByNet.has(lower(p.net))) pinByNet.set(lower(p.net), `${c.name} pin ${p.pin}`);
  const partPinByNet = new Map<string, string>();
  for (const p of parts)
    for (const pin of p.pins)
      if (!partPinByNet.has(lower(pin.net))) partPinByNet.set(lower(pin.net), `${designator(p.designator)} ${pinWord(p.kind, pin.pin)}`);
  // A net's label only when someone wrote one: a label that repeats the net name is the net name.
  const netLabels = new Map((model?.nets ?? []).filter((n) => n.label.trim() && lower(n.label) !== lower(n.name)).map((n) => [lower(n.name), n.label]));

  const probe = (s: string) => {
    const key = lower(s);
    const tp = pointById.get(key) ?? pointByNet.get(key);
    if (tp) return tp.label ? `${tp.id} ${tp.label}` : tp.id;
    if (key === '0' || key === 'gnd') return pinByNet.get('0') ? `bus negative (${pinByNet.get('0')})` : 'bus negative';
    return pinByNet.get(key) ?? partPinByNet.get(key) ?? netLabels.get(key) ?? 'a point not on the board map';
  };

  const probes = (r: { red: string; black: string; alone?: string | null }) => {
    if (!r.alone) return `${probe(r.red)} to ${probe(r.black)}`;
    const p = partOf(r.alone);
    const name = `${designator(r.alone)} alone`;
    if (!p || p.pins.length <= 2) return name;
    const pinOf = (net: string) => {
      const pin = p.pins.find((x) => lower(x.net) === lower(net));
      return pin ? pinWord(p.kind, pin.pin) : 'a pin';
    };
    return `${name}, ${pinOf(r.red)} to ${pinOf(r.black)}`;
  };

  return {
    designator,
    kind,
    probes,
    fault: (element, mode) => {
      const k = partOf(element)?.kind;
      const name = [designator(element), k ? KIND_WORDS[k] : undefined].filter(Boolean).join(' ');
      return `${name} — ${modeWords(mode, k)}`;
    },
    probe,
  };
}

const arr = (x: unknown): Record<string, unknown>[] =>
  Array.isArray(x) ? x.filter((v): v is Record<string, unknown> => typeof v === 'object' && v !== null) : [];
const text = (x: unknown) => (typeof x === 'string' ? x : '');

/**
 * The words' part of a board document read leniently: a document that does not pass the full board-model schema
 * (an older or hand-written one) still names its test points, connectors and parts, never its nets.
 */
export function wordsModelOf(document: unknown): WordsModel | null {
  if (typeof document !== 'object' || document === null) return null;
  const d = document as Record<string, unknown>;
  return {
    parts: arr(d.parts).map((p) => ({
      ...(p as object),
      designator: text(p.designator) || text(p.ref) || text(p.name),
      element: text(p.element) || undefined,
      kind: text(p.kind) as BoardModel['parts'][number]['kind'],
      pins: arr(p.pins).map((x) => ({ pin: text(x.pin), net: text(x.net) })),
    })) as BoardModel['parts'],
    testPoints: arr(d.testPoints).map((t) => ({
      ...(t as object),
      id: text(t.id) || text(t.net),
      label: text(t.label),
      net: text(t.net),
    })) as BoardModel['testPoints'],
    connectors: arr(d.connectors).map((c) => ({
      ...(c as object),
      name: text(c.name),
      pins: arr(c.pins).map((x) => ({ pin: text(x.pin), net: text(x.net), function: text(x.function) })),
    })) as BoardModel['connectors'],
    nets: arr(d.nets).map((n) => ({ ...(n as object), name: text(n.name), label: text(n.label) })) as BoardModel['nets'],
  };
}
