/**
 * Hazardous nets of a powered board: the mains input (AC) and the rectified bus.
 *
 * The DC model stands the mains input for a DC source of its peak (√2·Vrms) feeding the bridge, or stands the
 * whole rectifier for one DC source on the bus. Neither says that the line and neutral inputs swing with the
 * mains, so the model's DC voltage at N (near 0 V, or half the bus) is not what a meter would see, and a probe
 * there is a probe on mains. Rules:
 * - a mains-equivalent source is an independent voltage source of at least HAZARD_VOLTS;
 * - AC mains nets: the terminals of a mains-equivalent source with neither terminal on the reference (a floating
 *   source feeds a rectifier: it is the line input), and the nets joined to them by series input parts (fuses,
 *   inrush thermistors, resistors of at most SERIES_INPUT_OHMS; common practice for an input stage), or the nets
 *   a board names in `acMains`;
 * - bus nets: every net at HAZARD_VOLTS or more from the reference on the healthy powered board.
 * HAZARD_VOLTS = 60 V, the SELV d.c. limit of IEC 60950-1 [secondary, see the references file]; below it a
 * net is not flagged (the general "board live" caution still applies to every powered probe). The bus negative
 * (the reference) is not flagged by itself: every powered reading uses it.
 *
 * The rectified-bus source also drives the bulk capacitor's behavioural modes (faults.ts): with the bulk
 * capacitor open the bus is the unsmoothed full-wave rectified sine, whose mean is 2/π of its peak
 * (2√2/π·Vrms; any circuits textbook), so the mode scales that source by 2/π.
 */
import type { Circuit } from '@splitscope/circuit';

export const HAZARD_VOLTS = 60;
export const SERIES_INPUT_OHMS = 100;

export interface Hazards {
  /** AC mains nets (lower case). */
  ac: Set<string>;
  /** Nets at HAZARD_VOLTS or more when powered (lower case). */
  bus: Set<string>;
  /** The mains-equivalent source feeding the bus (flat element name, lower case), if any. */
  busSource?: string;
  /** Largest source voltage of the board (for the broad density). */
  maxVolts: number;
}

export function findHazards(powered: Circuit, voltages: Record<string, number> | undefined, acMains: readonly string[] = []): Hazards {
  const sources = powered.elements.filter((e) => e.kind === 'V' && Math.abs(e.value) >= HAZARD_VOLTS);
  let maxVolts = 0;
  for (const e of powered.elements) if (e.kind === 'V') maxVolts = Math.max(maxVolts, Math.abs(e.value));
  const ac = new Set(acMains.map((n) => n.toLowerCase()));
  for (const s of sources) if (!s.nodes.includes('0')) for (const n of s.nodes) ac.add(n);
  // Grow the AC set through series input parts.
  let grew = ac.size > 0;
  while (grew) {
    grew = false;
    for (const e of powered.elements) {
      if (e.kind !== 'R' || e.value > SERIES_INPUT_OHMS) continue;
      const [a, b] = e.nodes;
      if (a === '0' || b === '0') continue;
      if (ac.has(a) !== ac.has(b)) {
        ac.add(ac.has(a) ? b : a);
        grew = true;
      }
    }
  }
  const bus = new Set<string>();
  for (const [net, v] of Object.entries(voltages ?? {})) if (net !== '0' && Math.abs(v) >= HAZARD_VOLTS && !ac.has(net)) bus.add(net);
  const busSource = [...sources].sort((a, b) => Math.abs((b as { value: number }).value) - Math.abs((a as { value: number }).value))[0];
  return { ac, bus, busSource: busSource?.name.toLowerCase(), maxVolts };
}
