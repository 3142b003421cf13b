/**
 * Candidate next measurements, their cost and the sentence a trainee follows.
 *
 * Candidates: every test point (the case's `testPoints`, or else every net the likeliest parts touch plus the
 * nets already probed) against its reference net, in each meter mode in its power state — dcv powered; ohm,
 * continuity and diode (both polarities) unpowered — in the bench's current lift state, plus: each of the
 * `liftTopParts` likeliest parts lifted with the probe on its own nets.
 *
 * Cost (relative units, common practice for the order, the numbers are from memory): moving a probe 1;
 * powering up 3; unplugging and waiting for / checking the bus discharge 4; lifting a part with the iron 6 per
 * part; refitting a lifted part 4 per part.
 */
import type { ElectricalTest } from './model.js';
import type { MeterMode } from './noise.js';

export interface TestPoint {
  net: string;
  label?: string;
  /** Reference net (default "0"). */
  ref?: string;
}

export interface BenchState {
  power: 'on' | 'off';
  lifted: string[];
}

export const COST = { probe: 1, powerOn: 3, powerOff: 4, lift: 6, refit: 4 } as const;

export function testCost(t: ElectricalTest, cur: BenchState): number {
  let c = COST.probe;
  if (t.power !== cur.power) c += t.power === 'on' ? COST.powerOn : COST.powerOff;
  const curSet = new Set(cur.lifted.map((p) => p.toLowerCase()));
  const newSet = new Set(t.lifted.map((p) => p.toLowerCase()));
  for (const p of newSet) if (!curSet.has(p)) c += COST.lift;
  for (const p of curSet) if (!newSet.has(p)) c += COST.refit;
  return c;
}

export function netLabel(net: string, points: readonly TestPoint[]): string {
  if (net === '0') return 'GND';
  const tp = points.find((p) => p.net.toLowerCase() === net);
  return tp?.label ? `${net.toUpperCase()} (${tp.label})` : net.toUpperCase();
}

const READ: Record<MeterMode, string> = {
  dcv: 'read DC volts',
  ohm: 'read resistance',
  diode: 'read the diode-test drop',
  continuity: 'listen for the continuity beep',
};

export function instruction(t: ElectricalTest, cur: BenchState, points: readonly TestPoint[]): string {
  const steps: string[] = [];
  const curSet = new Set(cur.lifted.map((p) => p.toLowerCase()));
  const newSet = new Set(t.lifted.map((p) => p.toLowerCase()));
  const toLift = t.lifted.filter((p) => !curSet.has(p.toLowerCase()));
  const toRefit = cur.lifted.filter((p) => !newSet.has(p.toLowerCase()));
  const needOff = toLift.length > 0 || toRefit.length > 0 || (t.power === 'off' && cur.power === 'on');
  if (needOff && cur.power === 'on') steps.push('unplug the board and confirm the bus is discharged');
  if (toRefit.length > 0) steps.push(`solder ${toRefit.join(', ')} back in`);
  if (toLift.length > 0) steps.push(`lift ${toLift.join(', ')} with the iron`);
  if (t.power === 'on' && (cur.power === 'off' || needOff)) {
    steps.push(t.lifted.length > 0 ? `power the board with ${t.lifted.join(', ')} still lifted` : 'power the board');
  }
  const probe = `put the red probe on ${netLabel(t.red, points)} and the black on ${netLabel(t.black, points)} and ${READ[t.mode]}`;
  const s = steps.length > 0 ? `${steps.join(', ')}, then ${probe}` : probe;
  const warn = t.power === 'on' ? ' (board live: keep one hand away from the bus)' : '';
  return s.charAt(0).toUpperCase() + s.slice(1) + warn;
}

export interface PartNets {
  name: string;
  nets: readonly string[];
}

export function candidateTests(opts: {
  points: readonly TestPoint[];
  cur: BenchState;
  liftParts: readonly PartNets[];
}): ElectricalTest[] {
  const out = new Map<string, ElectricalTest>();
  const add = (t: ElectricalTest) => {
    if (t.red === t.black) return;
    out.set(`${t.mode}|${t.red}|${t.black}|${t.power}|${t.lifted.join(',')}`, t);
  };
  const lifted = [...opts.cur.lifted].sort();
  const probeSet = (red: string, black: string, lift: string[], modes: readonly MeterMode[]) => {
    for (const mode of modes) {
      const power = mode === 'dcv' ? 'on' : 'off';
      add({ mode, red, black, power, lifted: lift });
      if (mode === 'diode') add({ mode, red: black, black: red, power, lifted: lift });
    }
  };
  for (const p of opts.points) probeSet(p.net.toLowerCase(), (p.ref ?? '0').toLowerCase(), lifted, ['dcv', 'ohm', 'continuity', 'diode']);
  for (const part of opts.liftParts) {
    if (lifted.some((l) => l.toLowerCase() === part.name.toLowerCase())) continue;
    const lift = [...lifted, part.name].sort();
    for (const net of part.nets) {
      if (net === '0') continue;
      probeSet(net, '0', lift, ['ohm', 'continuity', 'dcv']);
    }
  }
  return [...out.values()];
}
