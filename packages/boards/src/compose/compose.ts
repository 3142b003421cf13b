/**
 * composeBoard: section instances (shared templates or plain SPICE) + board metadata → a board-model document.
 * Pure and free of the circuit package, so the board editor can compose in the browser; the expected readings
 * are computed from the result by `@splitscope/boards/readings`.
 */
import { BOARD_MODEL_SCHEMA_VERSION, boardModelSchema, type BoardModel, type BoardSide } from '@splitscope/contract';
import { formatSi } from '../references/decode-marking';
import { MODELS, SUBCKTS } from '../sections/library';
import { TEMPLATES } from '../sections/templates';
import type { NetInfo, SectionTemplate, TemplatePart, TestPointSuggestion } from '../sections/types';
import { renderBoardSvg } from './render';
import { spiceParts } from './spice-section';
import type { BoardSpec, Region, SectionInstance, TemplateSectionInstance, TestPointChoice } from './types';

/** What a section instance resolves to before it is placed on the board. */
interface Resolved {
  id: string;
  title: string;
  template: string;
  params: Record<string, number | string | boolean>;
  side: BoardSide;
  touchesBus: boolean;
  fragment: string;
  parts: TemplatePart[];
  nets: NetInfo[];
  suggestions: TestPointSuggestion[];
  sourceParams: Record<string, number>;
  uses: string[];
  region: Region;
  place: NonNullable<SectionInstance['place']>;
}

export class ComposeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ComposeError';
  }
}

function resolve(inst: SectionInstance, templates: Record<string, SectionTemplate>): Resolved {
  const common = { id: inst.id, region: inst.region, place: inst.place ?? {} };
  if ('spice' in inst) {
    const { parts } = spiceParts(inst.spice, inst.offBoard, inst.kinds);
    return {
      ...common,
      title: inst.title ?? inst.id,
      template: 'spice',
      params: {},
      side: inst.side,
      touchesBus: inst.touchesBus,
      fragment: `* ${inst.id}: ${inst.title ?? inst.id}\n${inst.spice.trim()}`,
      parts,
      nets: inst.nets ?? [],
      suggestions: inst.testPoints ?? [],
      sourceParams: {},
      uses: [],
    };
  }
  const template = templates[inst.template];
  if (!template) throw new ComposeError(`section "${inst.id}": unknown template "${inst.template}" (known: ${Object.keys(templates).join(', ')})`);
  const out = withValues(inst, template({ id: inst.id, base: inst.base, nets: inst.nets ?? {}, params: inst.params ?? {} }));
  return {
    ...common,
    title: inst.title ?? out.title,
    template: out.template,
    params: inst.params ?? {},
    side: out.side,
    touchesBus: out.touchesBus,
    fragment: out.netlist,
    parts: out.parts,
    nets: out.nets,
    suggestions: out.testPoints,
    sourceParams: out.params,
    uses: out.uses,
  };
}

/** Puts the values read off the board into a template's resistors and capacitors (netlist line and part list). */
function withValues(inst: TemplateSectionInstance, out: ReturnType<SectionTemplate>): ReturnType<SectionTemplate> {
  const values = inst.values ?? {};
  const markings = inst.markings ?? {};
  for (const d of Object.keys(values)) {
    const part = out.parts.find((p) => p.designator === d);
    if (!part)
      throw new ComposeError(`section "${inst.id}": no part ${d} in the ${out.title} template (its parts: ${out.parts.map((p) => p.designator).join(', ')})`);
    const isR = part.kind === 'resistor';
    if (!isR && part.kind !== 'ceramic-capacitor' && part.kind !== 'electrolytic-capacitor') {
      throw new ComposeError(`section "${inst.id}": ${d} is a ${part.kind}; only resistor and capacitor values are typed in`);
    }
    const v = values[d]!;
    if (!(v > 0) || !Number.isFinite(v)) throw new ComposeError(`section "${inst.id}": ${d} needs a positive value, got ${v}`);
  }
  if (!Object.keys(values).length && !Object.keys(markings).length) return out;
  const parts = out.parts.map((p) => {
    const v = values[p.designator];
    const m = markings[p.designator];
    if (v === undefined && m === undefined) return p;
    const unit = p.kind === 'resistor' ? 'Ω' : 'F';
    return { ...p, ...(v !== undefined ? { nominal: v, value: formatSi(v, unit).replace(' ', '') } : {}), ...(m ? { marking: m.slice(0, 64) } : {}) };
  });
  const netlist = out.netlist
    .split('\n')
    .map((line) => {
      const tokens = line.trim().split(/\s+/);
      const v = values[tokens[0] ?? ''];
      return v !== undefined && tokens.length === 4 ? [...tokens.slice(0, 3), String(v)].join(' ') : line;
    })
    .join('\n');
  return { ...out, parts, netlist };
}

const CELL_W = 86;
const CELL_H = 66;

/** Fills a section's region row by row, leaving the top strip for its silkscreen title. */
function placeParts(sec: Resolved): Map<string, { x: number; y: number; rotation: number }> {
  const out = new Map<string, { x: number; y: number; rotation: number }>();
  const cols = Math.max(1, Math.floor((sec.region.w - 16) / CELL_W));
  let i = 0;
  for (const p of sec.parts) {
    const fixed = sec.place[p.designator];
    if (fixed) {
      out.set(p.designator, { x: fixed.x, y: fixed.y, rotation: fixed.rotation ?? 0 });
      continue;
    }
    const x = sec.region.x + 8 + CELL_W / 2 + (i % cols) * CELL_W;
    const y = sec.region.y + 70 + Math.floor(i / cols) * CELL_H;
    out.set(p.designator, { x: Math.round(x), y: Math.round(y), rotation: 0 });
    i++;
  }
  return out;
}

function composeNetlist(spec: BoardSpec, secs: Resolved[], params: Record<string, number>, cold: string | undefined): string {
  const uses = [...new Set(secs.flatMap((s) => s.uses))];
  const models = uses.filter((u) => MODELS[u]).map((u) => MODELS[u]!);
  const subckts = uses.filter((u) => SUBCKTS[u]).map((u) => SUBCKTS[u]!());
  const paramLine = Object.keys(params).length
    ? [
        `.param ${Object.entries(params)
          .map(([k, v]) => `${k}=${v}`)
          .join(' ')}`,
      ]
    : [];
  // The parser takes the first line as the title, so it must be a comment naming the board.
  const lines = [`* ${spec.name} (composed board model, ${secs.length} sections)`, ...paramLine, ...models, ...subckts];
  if (spec.header) lines.push(spec.header.trim());
  for (const s of secs) lines.push('', s.fragment);
  if (cold) {
    // 22 MΩ rather than a truer 100 MΩ or more: with 100 MΩ the operating point of the indoor demo board does not
    // converge (the cold side floats on nano-amps), and every reading is taken against its own side's ground.
    lines.push(
      '',
      `* isolation: the cold ground meets bus negative only through the supply's insulation. 22 MΩ stands for it so`,
      `* every node has a DC path to the reference (not a part on the board); no reading is taken across it`,
      `RISO ${cold} 0 22meg`,
    );
  }
  lines.push('.end', '');
  return lines.join('\n');
}

/** Composes a board model document and validates it against the contract's board-model schema. */
/** The board-model document of a spec. Its picture holds only the size: the drawing is `drawBoard(spec)`. */
export function composeBoard(spec: BoardSpec, templates: Record<string, SectionTemplate> = TEMPLATES): BoardModel {
  return composeWithDrawing(spec, templates).model;
}

/**
 * The picture of a composed board (SVG) drawn from its layout, or the spec's own svg. Kept out of the document so
 * the document stays small; the server draws it from the stored composition when a picture is asked for.
 */
export function drawBoard(spec: BoardSpec, templates: Record<string, SectionTemplate> = TEMPLATES): string {
  return composeWithDrawing(spec, templates).svg;
}

function composeWithDrawing(spec: BoardSpec, templates: Record<string, SectionTemplate>): { model: BoardModel; svg: string } {
  const secs = spec.sections.map((s) => resolve(s, templates));
  const ids = new Set<string>();
  for (const s of secs) {
    if (ids.has(s.id)) throw new ComposeError(`section id "${s.id}" is used twice`);
    ids.add(s.id);
  }
  const params: Record<string, number> = { ...Object.assign({}, ...secs.map((s) => s.sourceParams)), ...spec.params };

  // Nets: the templates' human names first, then every other net a part touches.
  const netInfo = new Map<string, NetInfo>();
  for (const s of secs) for (const n of s.nets) if (!netInfo.has(n.name)) netInfo.set(n.name, n);
  const coldGround = spec.coldGround ?? 'gnd_c';
  const usesCold = secs.some((s) => s.parts.some((p) => p.pins.some((pin) => pin.net === coldGround)) || s.nets.some((n) => n.name === coldGround));
  const groundOf = (side: BoardSide) => (side === 'cold' ? coldGround : '0');
  const sideOfNet = (net: string, fallback: BoardSide): BoardSide => netInfo.get(net)?.side ?? (net === '0' ? 'hot' : net === coldGround ? 'cold' : fallback);

  const parts: BoardModel['parts'] = [];
  const dup = new Set<string>();
  for (const s of secs) {
    const pos = placeParts(s);
    for (const p of s.parts) {
      if (dup.has(p.designator)) throw new ComposeError(`designator ${p.designator} is used twice (section "${s.id}"): give the section another base`);
      dup.add(p.designator);
      const sides = p.pins.map((pin) => sideOfNet(pin.net, s.side));
      const side: BoardSide = sides.length > 0 && sides.every((x) => x === 'cold') ? 'cold' : s.side;
      const priors = spec.priors?.[p.designator];
      parts.push({ ...p, ...pos.get(p.designator)!, section: s.id, side, ...(priors ? { priors } : {}) });
    }
  }
  for (const c of spec.testPoints ?? []) {
    const sec = secs.find((s) => s.id === c.section);
    const side = sideOfNet(c.net, sec?.side ?? 'hot');
    if (!netInfo.has(c.net) && c.label) netInfo.set(c.net, { name: c.net, label: c.label, side, reference: groundOf(side) });
  }
  for (const p of parts) {
    for (const pin of p.pins) {
      if (netInfo.has(pin.net)) continue;
      const side = sideOfNet(pin.net, p.side ?? 'hot');
      const label = pin.net === '0' ? 'Bus − (hot ground)' : pin.net === coldGround ? 'Controller ground (cold)' : pin.net;
      netInfo.set(pin.net, { name: pin.net, label, side, reference: groundOf(side) });
    }
  }

  const testPoints = chooseTestPoints(spec.testPoints, secs, parts, netInfo, groundOf);
  const cold = usesCold ? coldGround : undefined;
  const netlist = composeNetlist(spec, secs, params, cold);
  const sections = secs.map((s) => ({ id: s.id, template: s.template, params: s.params, side: s.side, title: s.title, touchesBus: s.touchesBus }));
  const svg =
    spec.svg ??
    renderBoardSvg({
      width: spec.width,
      height: spec.height,
      colours: spec.colours,
      title: spec.silkTitle ?? spec.name,
      sections: secs.map((s) => ({ id: s.id, title: s.title, side: s.side, touchesBus: s.touchesBus, region: s.region })),
      parts,
      connectors: spec.connectors ?? [],
      testPoints,
      grounds: ['0', coldGround],
    });
  const model = boardModelSchema.parse({
    schemaVersion: BOARD_MODEL_SCHEMA_VERSION,
    // The drawing is made again from the layout when asked for; a given svg is not kept in the document.
    composition: { ...spec, svg: undefined },
    id: spec.id,
    slug: spec.slug,
    name: spec.name,
    family: spec.family,
    maker: spec.maker,
    ...(spec.description ? { description: spec.description } : {}),
    picture: { width: spec.width, height: spec.height, units: 'px' },
    sections,
    netlist,
    params,
    parts,
    nets: [...netInfo.values()],
    connectors: spec.connectors ?? [],
    testPoints,
    faultCodes: spec.faultCodes ?? [],
    ...(spec.motor ? { motor: spec.motor } : {}),
    cautions: spec.cautions ?? [],
  });
  return { model, svg };
}

function chooseTestPoints(
  choices: TestPointChoice[] | undefined,
  secs: Resolved[],
  parts: BoardModel['parts'],
  nets: Map<string, NetInfo>,
  groundOf: (side: BoardSide) => string,
): BoardModel['testPoints'] {
  const suggestions = secs.flatMap((s) => s.suggestions.map((t) => ({ ...t, section: s.id })));
  const wanted: (TestPointChoice & { suggestion?: (typeof suggestions)[number] })[] = choices
    ? choices.map((c) => ({ ...c, suggestion: suggestions.find((t) => t.net === c.net) }))
    : suggestions
        .filter((t, i) => suggestions.findIndex((u) => u.net === t.net && u.reference === t.reference) === i)
        .map((t, i) => ({ id: `TP${i + 1}`, net: t.net, label: t.label, section: t.section, suggestion: t }));
  const perPart = new Map<string, number>();
  return wanted.map((c) => {
    const sectionId = c.section ?? c.suggestion?.section;
    const onNet = (p: BoardModel['parts'][number]) => p.pins.some((pin) => pin.net === c.net);
    const near = parts.find((p) => p.designator === c.near) ?? parts.find((p) => p.section === sectionId && onNet(p)) ?? parts.find(onNet);
    if (!near) throw new ComposeError(`test point ${c.id}: no part on net "${c.net}" to place it beside`);
    const n = perPart.get(near.designator) ?? 0;
    perPart.set(near.designator, n + 1);
    const info = nets.get(c.net);
    const side = info?.side ?? near.side ?? 'hot';
    const s = c.suggestion;
    return {
      id: c.id,
      label: c.label ?? s?.label ?? info?.label ?? c.net,
      net: c.net,
      reference: s?.reference ?? info?.reference ?? groundOf(side),
      x: near.x + 30 + n * 26,
      y: near.y - 24,
      powerStates: s?.powerStates ?? ['on', 'off'],
      modes: s?.modes ?? ['dcv', 'ohm', 'diode', 'continuity'],
      section: sectionId ?? near.section,
      // The whole hot side shares bus negative with the bulk capacitor in reach: an unpowered test anywhere on it
      // needs the bus discharged first (common practice).
      touchesBus: side === 'hot',
      side,
      ...(s?.band ? { band: s.band } : {}),
    };
  });
}
