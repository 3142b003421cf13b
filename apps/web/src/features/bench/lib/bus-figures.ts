/**
 * Picks the inputs of the board library's bus-safety calculation out of the board model and its expected table:
 * the bulk capacitor (largest electrolytic on a section that touches the bus), the bleeder (a resistor straight
 * across that capacitor) and the highest healthy bus voltage the engine computed. The calculation itself is
 * `busSafety` from the board library.
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
  const volts = rows
    .filter((r) => r.mode === 'dcv' && r.power === 'on' && (busPoints.has(r.red.toLowerCase()) || capNets.has(r.red.toLowerCase())))
    .map((r) => Math.max(typeof r.expected === 'number' ? Math.abs(r.expected) : 0, Math.abs(r.high ?? 0)));
  const busVolts = volts.length ? Math.max(...volts) : 0;
  if (!(busVolts > 0)) return null;
  return { capacitanceF: cap.nominal!, bleederOhms: bleeder?.nominal, busVolts, capacitor: cap.designator, bleeder: bleeder?.designator };
}
