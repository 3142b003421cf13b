/**
 * Picks the inputs of the board library's bus-safety calculation out of the board model and its expected table:
 * the bulk capacitor (largest electrolytic on a section that touches the bus), the bleed path and the highest
 * healthy bus voltage the engine computed. The bleed path is the engine's unpowered resistance across the
 * capacitor: every discharge route in parallel (series bleeders, sense dividers), which is what empties it.
 * Without that row, a single resistor straight across the capacitor. The calculation is `busSafety`.
 */
import type { ExpectedReadingRow } from '@splitscope/contract';
import type { BoardView } from './board-view';

export interface BusFigures {
  capacitanceF: number;
  bleederOhms?: number;
  busVolts: number;
  capacitor: string;
  bleeder?: string;
}

export function busFigures(view: BoardView, rows: ExpectedReadingRow[]): BusFigures | null {
  const m = view.model;
  if (!m) return null;
  const busSections = new Set(m.sections.filter((s) => s.touchesBus).map((s) => s.id));
  const caps = m.parts
    .filter((p) => p.kind === 'electrolytic-capacitor' && busSections.has(p.section) && typeof p.nominal === 'number' && p.pins.length >= 2)
    .sort((a, b) => (b.nominal ?? 0) - (a.nominal ?? 0));
  const cap = caps[0];
  if (!cap) return null;
  const capNets = new Set(cap.pins.map((p) => p.net.toLowerCase()));
  const bleeder = m.parts.find(
    (p) => p.kind === 'resistor' && typeof p.nominal === 'number' && p.pins.length === 2 && p.pins.every((x) => capNets.has(x.net.toLowerCase())),
  );
  const busPoints = new Set(view.points.filter((p) => capNets.has(p.net.toLowerCase())).map((p) => p.id.toLowerCase()));
  const onCap = (probe: string) => busPoints.has(probe.toLowerCase()) || capNets.has(probe.toLowerCase());
  const ohmRow = rows.find(
    (r) => r.mode === 'ohm' && r.power === 'off' && r.lifted.length === 0 && onCap(r.red) && onCap(r.black) && typeof r.expected === 'number',
  );
  const volts = rows
    .filter((r) => r.mode === 'dcv' && r.power === 'on' && (busPoints.has(r.red.toLowerCase()) || capNets.has(r.red.toLowerCase())))
    .map((r) => Math.max(typeof r.expected === 'number' ? Math.abs(r.expected) : 0, Math.abs(r.high ?? 0)));
  const busVolts = volts.length ? Math.max(...volts) : 0;
  if (!(busVolts > 0)) return null;
  if (ohmRow) {
    const ohms = ohmRow.expected as number;
    return {
      capacitanceF: cap.nominal!,
      bleederOhms: ohms,
      busVolts,
      capacitor: cap.designator,
      bleeder: `the in-circuit discharge path (${Math.round(ohms / 1000)} kΩ computed)`,
    };
  }
  return { capacitanceF: cap.nominal!, bleederOhms: bleeder?.nominal, busVolts, capacitor: cap.designator, bleeder: bleeder?.designator };
}
