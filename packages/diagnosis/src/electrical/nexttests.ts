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
 * part; refitting a lifted part 4 per part; a powered probe on a hazardous net (mains or the bus, hazard.ts) 3
 * more, so a safer test that tells as much wins.
 * A test already taken (same quantity: mode, nets, power, lifted parts) is never offered again unless the
 * caller asks for confirmations; a DC volts probe on an AC mains net is never offered (the DC model cannot
 * predict it).
 */
import type { ElectricalTest } from './model.js';
import type { MeterMode } from './noise.js';
import { probePoint, type ProbePoint } from './words.js';

export interface TestPoint {
  net: string;
  /** The test point's label. With `id`, a description ("Fan control supply"); without, its printed name. */
  label?: string;
  /** Reference net (default "0"). */
  ref?: string;
  /** The name printed on the board (TP5). */
  id?: string;
  description?: string;
  /** Connector and pin when the test point is a connector pin. */
  connector?: string;
  pin?: string;
}

export type Hazard = 'mains' | 'bus';

/** The caution shown with a powered probe on a hazardous net (the product defers to local codes). */
export const HAZARD_CAUTION: Readonly<Record<Hazard, string>> = {
  mains:
    'Mains: this point carries the AC line when the board is plugged in. Use a meter and leads rated for mains (CAT II or better), one hand, no earthed instrument on the hot side; follow local codes and licensed practice.',
  bus: 'DC bus: this point carries the rectified mains bus (hundreds of volts) when powered and for a while after unplugging. Keep one hand away, use rated leads; follow local codes and licensed practice.',
};

export interface BenchState {
  power: 'on' | 'off';
  lifted: string[];
}

export const COST = { probe: 1, powerOn: 3, powerOff: 4, lift: 6, refit: 4, hazard: 3 } as const;

export function testCost(t: ElectricalTest, cur: BenchState, hazard?: Hazard): number {
  let c = COST.probe;
  if (hazard && t.power === 'on') c += COST.hazard;
  if (t.power !== cur.power) c += t.power === 'on' ? COST.powerOn : COST.powerOff;
  const curSet = new Set(cur.lifted.map((p) => p.toLowerCase()));
  const newSet = new Set(t.lifted.map((p) => p.toLowerCase()));
  for (const p of newSet) if (!curSet.has(p)) c += COST.lift;
  for (const p of curSet) if (!newSet.has(p)) c += COST.refit;
  return c;
}

/** Names a net for a sentence: from a namer (words.ts) or, given test points only, their labels. */
export type NetNamer = (net: string) => ProbePoint;

function namerOf(points: readonly TestPoint[] | NetNamer): NetNamer {
  if (typeof points === 'function') return points;
  return (net) =>
    probePoint(
      net,
      points.map((p) => ({ ...p, net: p.net.toLowerCase() })),
      [],
      [],
    );
}

const READ: Record<MeterMode, string> = {
  dcv: 'read DC volts',
  ohm: 'read resistance',
  diode: 'read the diode-test drop',
  continuity: 'listen for the continuity beep',
};

export function instruction(t: ElectricalTest, cur: BenchState, points: readonly TestPoint[] | NetNamer, hazard?: Hazard): string {
  const name = namerOf(points);
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
  const probe = `put the red probe on ${name(t.red).said} and the black on ${name(t.black).said} and ${READ[t.mode]}`;
  const s = steps.length > 0 ? `${steps.join(', ')}, then ${probe}` : probe;
  const warn =
    t.power !== 'on' ? '' : hazard ? ` (${hazard === 'mains' ? 'mains' : 'DC bus'} live: see the caution)` : ' (board live: keep one hand away from the bus)';
  return s.charAt(0).toUpperCase() + s.slice(1) + warn;
}

export interface PartNets {
  name: string;
  nets: readonly string[];
}

export function candidateTests(opts: { points: readonly TestPoint[]; cur: BenchState; liftParts: readonly PartNets[] }): ElectricalTest[] {
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
