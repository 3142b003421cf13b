// The one rule for when a reading needs the bus-discharge gate first, shared by the bench screen (which shows
// the gate) and the server (which refuses a trainee's unpowered step that skipped it).
import { z } from 'zod';
import { voltsSchema } from './bounds';

/** What the technician attests at the gate: unplugged, and the bus voltage measured just now. */
export const safetyCheckSchema = z.object({
  unplugged: z.literal(true),
  /**
   * DC volts across the bulk capacitor, measured after unplugging, as the meter showed it: a negative value is a
   * reading with the probes reversed, judged by its magnitude (`judgeBusVolts`), and refused in words there.
   */
  busVolts: voltsSchema,
});
export type SafetyCheck = z.infer<typeof safetyCheckSchema>;

interface GatePoint {
  id: string;
  net: string;
  section?: string;
  touchesBus?: boolean;
}
export interface GateModel {
  testPoints: readonly GatePoint[];
  sections: readonly { id: string; touchesBus?: boolean }[];
}

const norm = (s: string) => s.trim().toLowerCase();

/**
 * Whether a reading between these probes (test point ids or net names) is on a section that touches the DC
 * bus, as the board model marks its test points and sections. A probe on no known point is gated: when the
 * model cannot say, assume the bus is there (common practice: treat every capacitor as charged until measured).
 */
export function probesTouchBus(model: GateModel, red: string, black: string): boolean {
  const busSections = new Set(model.sections.filter((s) => s.touchesBus).map((s) => norm(s.id)));
  const find = (p: string) => model.testPoints.find((tp) => norm(tp.id) === norm(p)) ?? model.testPoints.find((tp) => norm(tp.net) === norm(p));
  const points = [red, black].map(find).filter((p) => p !== undefined);
  if (points.length === 0) return true;
  return points.some((p) => p.touchesBus === true || (p.section !== undefined && busSections.has(norm(p.section))));
}

export type BusJudgement = { ok: true; magnitude: number } | { ok: false; message: string };

const volts = (v: number) => `${Number(v.toPrecision(4))} V`.replace('-', '\u2212');

/**
 * Whether a measured bus voltage lets unpowered work start: the magnitude must be below the safe threshold, as
 * a meter with reversed probes shows the same charge with a minus sign (common practice: a charged capacitor is
 * charged whichever way it is probed). Anything not a finite number is refused: a safety check never accepts a
 * value it does not understand.
 */
export function judgeBusVolts(busVolts: unknown, thresholdVolts: number): BusJudgement {
  if (typeof busVolts !== 'number' || !Number.isFinite(busVolts))
    return { ok: false, message: 'Enter the bus voltage in volts as the meter shows it (e.g. 3.2), measured across the bulk capacitor.' };
  const magnitude = Math.abs(busVolts);
  if (magnitude < thresholdVolts) return { ok: true, magnitude };
  if (busVolts < 0)
    return {
      ok: false,
      message: `Probes reversed? The bus reads ${volts(busVolts)}: that is ${volts(magnitude)} of charge, not below ${thresholdVolts} V. Discharge the bus through a rated resistor and measure again.`,
    };
  return {
    ok: false,
    message: `The bus still reads ${volts(busVolts)}, not below ${thresholdVolts} V: wait for it to bleed down or discharge it through a rated resistor, then measure again.`,
  };
}

/** Whether this reading must pass the discharge gate first: every unpowered reading on a bus net, in every phase, for every role. */
export function needsDischargeGate(model: GateModel | null, probe: { power: 'on' | 'off'; red: string; black: string }): boolean {
  if (probe.power !== 'off') return false;
  // A model that cannot be read says nothing about where the bus is: gate it.
  return model === null ? true : probesTouchBus(model, probe.red, probe.black);
}

/**
 * The gate as a whole, for a reading about to be stored: null when it may be stored, else the words that say
 * what to do. The server refuses with these words and the bench shows them before sending.
 */
export function dischargeGateRefusal(
  model: GateModel | null,
  probe: { power: 'on' | 'off'; red: string; black: string; safetyCheck?: { unplugged: boolean; busVolts: number } | undefined },
  threshold: { volts: number; standard: string },
): string | null {
  if (!needsDischargeGate(model, probe)) return null;
  if (!probe.safetyCheck?.unplugged)
    return `This unpowered reading is on a section that touches the DC bus: confirm the board is unplugged and enter the bus voltage measured now (below ${threshold.volts} V, ${threshold.standard}) first.`;
  const j = judgeBusVolts(probe.safetyCheck.busVolts, threshold.volts);
  return j.ok ? null : j.message;
}
