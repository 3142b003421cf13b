/**
 * The in-circuit lesson: an ohmmeter across a part reads every path between its probes, not the part alone
 * ("the meter's test current flows through all possible paths", TekPower TP40 manual; "disconnect one side of
 * the part", Jaycar QM1528 manual). Resistors that sit between the same two nets are found in the netlist and
 * the expected ohm reading says what the technician will see and why.
 */
import type { Circuit } from '@splitscope/circuit';

interface Resistor {
  name: string;
  ohms: number;
}

/** Top-level resistors (not inside a subcircuit) by the pair of nets they join. */
export function resistorsByNets(circuit: Circuit): Map<string, Resistor[]> {
  const out = new Map<string, Resistor[]>();
  for (const e of circuit.elements) {
    if (e.kind !== 'R' || e.name.toUpperCase() !== e.part.toUpperCase()) continue;
    const key = pairKey(e.nodes[0]!, e.nodes[1]!);
    out.set(key, [...(out.get(key) ?? []), { name: e.part, ohms: e.value }]);
  }
  return out;
}

export const pairKey = (a: string, b: string) => [a.toLowerCase(), b.toLowerCase()].sort().join('|');

/** Compact resistor value as on a schematic: 12000 → "12k", 6800 → "6.8k", 470 → "470", 1e6 → "1M". */
export function shortOhms(r: number): string {
  const [div, suffix] = r >= 1e6 ? [1e6, 'M'] : r >= 1e3 ? [1e3, 'k'] : [1, ''];
  return `${Number((r / div).toPrecision(3))}${suffix}`;
}

/** A reading in ohms for text: 4340 → "4.34 kΩ". */
export function ohmsText(r: number): string {
  const [div, suffix] = r >= 1e6 ? [1e6, 'M'] : r >= 1e3 ? [1e3, 'k'] : [1, ''];
  return `${Number((r / div).toPrecision(3))} ${suffix}Ω`;
}

export const parallelOf = (rs: readonly number[]) => 1 / rs.reduce((a, r) => a + 1 / r, 0);

const names = (rs: Resistor[]) =>
  rs.length === 2
    ? `${rs[0]!.name} and ${rs[1]!.name}`
    : `${rs
        .slice(0, -1)
        .map((r) => r.name)
        .join(', ')} and ${rs.at(-1)!.name}`;

/**
 * The note for an ohm reading between two nets, or undefined when the reading is the plain value of one part.
 * Two or more resistors across the probes: the parallel value and their names. One resistor whose in-circuit
 * reading differs from its value by more than 10 %: the other paths pull it.
 */
export function parallelNote(byNets: Map<string, Resistor[]>, red: string, black: string, reading: number | 'OL'): string | undefined {
  const rs = byNets.get(pairKey(red, black)) ?? [];
  if (rs.length >= 2) {
    const rp = parallelOf(rs.map((r) => r.ohms));
    let note = `reads ${rs.map((r) => shortOhms(r.ohms)).join(' ∥ ')} ≈ ${ohmsText(rp)} in circuit: parallel path through ${names(rs)}`;
    if (typeof reading === 'number' && Math.abs(reading - rp) / rp > 0.05) note += `; the rest of the board pulls it to ${ohmsText(reading)}`;
    return `${note}. Lift one end to read a single part.`;
  }
  if (rs.length === 1 && typeof reading === 'number') {
    const r = rs[0]!;
    if (Math.abs(reading - r.ohms) / r.ohms > 0.1) {
      return `${r.name} is ${shortOhms(r.ohms)} but reads ${ohmsText(reading)} in circuit: parallel paths through the rest of the board. Lift one end to read ${r.name} alone.`;
    }
  }
  return undefined;
}
