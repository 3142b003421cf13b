// Turns a bench board's netlist into the ngspice deck a reading needs: faults injected, the board's power state
// and lifted parts applied, and the meter connected as a circuit element, so ngspice computes what the meter shows.
// Written for the netlists of this bench only (one element per line, no continuation lines), on purpose apart
// from the engine's own parser: the bench must not share code with what it checks.

/** How a fault changes the netlist. */
export type Injection =
  | { do: 'short'; ohms: number } // two-terminal part replaced by a resistor
  | { do: 'open' } // part removed
  | { do: 'scale'; factor: number } // value × factor (R, C, L; F gain)
  | { do: 'be-open' } // BJT emitter lead cut at the junction: base–emitter open, base–collector kept
  | { do: 'ce-short'; ohms: number }
  | { do: 'be-short'; ohms: number }
  | { do: 'inner'; element: string; inner: Injection }; // inside this instance's own copy of its subcircuit

export interface FaultSpec {
  part: string;
  injection: Injection;
}

export interface DeckState {
  power: 'on' | 'off';
  lifted?: readonly string[];
}

/** xs[i], or an error naming what is missing (the bench's netlists are written by hand). */
export function at<T>(xs: readonly T[], i: number, what = 'item'): T {
  const x = xs[i];
  if (x === undefined) throw new Error(`no ${what} at ${i}`);
  return x;
}
const tokens = (line: string) => line.trim().split(/\s+/);

const isElement = (line: string) => /^[a-z]/i.test(line.trim());
const nameOf = (line: string) => at(tokens(line), 0).toUpperCase();
/** The part an element belongs to: a fault's added element (RFLT_Q1, RFLTCE_Q1) belongs to the faulty part. */
const ownerOf = (name: string) => name.replace(/^RFLT(CE|BE)?_/, '');

function editLine(line: string, inj: Injection, part: string): string[] {
  const t = tokens(line);
  const letter = nameOf(line).charAt(0);
  switch (inj.do) {
    case 'open':
      return [];
    case 'short':
      return [`RFLT_${part} ${t[1]} ${t[2]} ${inj.ohms}`];
    case 'scale': {
      const i = letter === 'F' ? 4 : 3;
      t[i] = String(spiceNumber(at(t, i, 'value')) * inj.factor);
      return [t.join(' ')];
    }
    case 'be-open':
      if (letter !== 'Q') throw new Error(`${part}: be-open needs a transistor`);
      return [[t[0], t[1], t[2], `${part.toLowerCase()}_eopen`, ...t.slice(4)].join(' ')];
    case 'ce-short':
      return [line, `RFLTCE_${part} ${t[1]} ${t[3]} ${inj.ohms}`];
    case 'be-short':
      return [line, `RFLTBE_${part} ${t[2]} ${t[3]} ${inj.ohms}`];
    case 'inner':
      throw new Error('inner faults are applied to a subcircuit copy');
  }
}

/** The netlist with the faults injected (subcircuit faults go into a copy of the subcircuit used by that instance only). */
export function injectFaults(netlist: string, faults: readonly FaultSpec[]): string {
  let lines = netlist.split('\n');
  const extraSubckts: string[] = [];
  for (const f of faults) {
    const where = topLevelIndex(lines, f.part);
    if (f.injection.do === 'inner') {
      const t = tokens(at(lines, where));
      const sub = at(t, t.length - 1);
      const body = subcktBody(lines, sub);
      const copyName = `${sub}_F${f.part}`;
      const inner = f.injection;
      let hit = false;
      const edited = body.flatMap((l) => {
        if (isElement(l) && nameOf(l) === inner.element.toUpperCase()) {
          hit = true;
          return editLine(l, inner.inner, `${f.part}_${inner.element}`);
        }
        return [l];
      });
      if (!hit) throw new Error(`${f.part}: no ${inner.element} in ${sub}`);
      const header = tokens(at(body, 0));
      extraSubckts.push([`${header[0]} ${copyName} ${header.slice(2).join(' ')}`, ...edited.slice(1)].join('\n'));
      t[t.length - 1] = copyName;
      lines[where] = t.join(' ');
    } else {
      lines = [...lines.slice(0, where), ...editLine(at(lines, where), f.injection, f.part), ...lines.slice(where + 1)];
    }
  }
  const end = lines.findIndex((l) => /^\.end\s*$/i.test(l.trim()));
  return [...lines.slice(0, end), ...extraSubckts, ...lines.slice(end)].join('\n');
}

function topLevelIndex(lines: string[], part: string): number {
  let depth = 0;
  for (let i = 0; i < lines.length; i += 1) {
    const l = at(lines, i).trim();
    if (/^\.subckt/i.test(l)) depth += 1;
    else if (/^\.ends/i.test(l)) depth -= 1;
    else if (depth === 0 && i > 0 && isElement(l) && nameOf(l) === part.toUpperCase()) return i;
  }
  throw new Error(`no part ${part} in the netlist`);
}

function subcktBody(lines: string[], name: string): string[] {
  const start = lines.findIndex((l) => new RegExp(`^\\.subckt\\s+${name}\\s`, 'i').test(l.trim()));
  const end = lines.findIndex((l, i) => i > start && /^\.ends/i.test(l.trim()));
  if (start < 0 || end < 0) throw new Error(`no subcircuit ${name}`);
  return lines.slice(start, end + 1);
}

/** SPICE number with scale suffix (f p n u m k meg g t), e.g. "4.7k", "10meg", "100n". */
export function spiceNumber(text: string): number {
  const m = /^([-+]?[0-9.]+(?:e[-+]?\d+)?)(meg|[fpnumkgt])?/i.exec(text);
  if (!m) throw new Error(`not a number: ${text}`);
  const scale: Record<string, number> = { f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, m: 1e-3, k: 1e3, meg: 1e6, g: 1e9, t: 1e12 };
  return Number(m[1]) * (m[2] ? (scale[m[2].toLowerCase()] ?? NaN) : 1);
}

/** DC value of an independent source line ("V1 a b DC 5", "V1 a b 5"). */
function sourceValue(line: string): number {
  const t = tokens(line);
  return spiceNumber(at(t, 3).toUpperCase() === 'DC' ? at(t, 4) : at(t, 3));
}

/**
 * The board in a power state. Unpowered: every independent source with a non-zero value is disconnected (the
 * board is unplugged, its supplies and controller outputs are gone); zero-valued sources stay, as the short a
 * pin held low is. Lifted parts are taken out of the board, with whatever their fault added (a shorted part lifted
 * takes its short with it).
 */
export function boardState(netlist: string, state: DeckState): string {
  const lifted = new Set((state.lifted ?? []).map((p) => p.toUpperCase()));
  let depth = 0;
  return netlist
    .split('\n')
    .filter((raw, i) => {
      const l = raw.trim();
      if (/^\.subckt/i.test(l)) depth += 1;
      if (/^\.ends/i.test(l)) depth -= 1;
      if (depth > 0 || i === 0 || !isElement(l)) return true;
      if (lifted.has(ownerOf(nameOf(l)))) return false;
      return !(state.power === 'off' && /^[VI]/i.test(l) && sourceValue(l) !== 0);
    })
    .join('\n');
}

/** Replace the DC value of a source by the given SPICE source text (e.g. the mains' SIN for a transient run). */
export function withSource(netlist: string, source: string, text: string): string {
  return netlist
    .split('\n')
    .map((l) => (isElement(l) && nameOf(l) === source.toUpperCase() ? `${tokens(l).slice(0, 3).join(' ')} ${text}` : l))
    .join('\n');
}

/** Append elements and a control block before `.end`. */
export function withMeter(netlist: string, elements: readonly string[], control: readonly string[]): string {
  const lines = netlist.split('\n');
  const end = lines.findIndex((l) => /^\.end\s*$/i.test(l.trim()));
  return [
    ...lines.slice(0, end),
    // Nodes an unplugged board or a lifted part leaves without a DC path get 1 TΩ to ground, as a real board's
    // leakage gives them; far below anything a handheld resolves.
    '.options rshunt=1e12',
    ...elements,
    '.control',
    ...control,
    '.endc',
    '.end',
  ].join('\n');
}
