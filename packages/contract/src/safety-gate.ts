// The one rule for when a reading needs the bus-discharge gate first, shared by the bench screen (which shows
// the gate) and the server (which refuses a trainee's unpowered step that skipped it).
import { z } from 'zod';
import { voltsSchema } from './bounds';

/** What the technician attests at the gate: unplugged, and the bus voltage measured just now. */
export const safetyCheckSchema = z.object({
  unplugged: z.literal(true),
  /** DC volts across the bulk capacitor, measured after unplugging. */
  busVolts: voltsSchema.min(0, 'must be at least 0 V'),
});
export type SafetyCheck = z.infer<typeof safetyCheckSchema>;

interface GatePoint {
  id: string;
  net: string;
  section?: string;
  touchesBus?: boolean;
}
interface GateModel {
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
