// The bench's own model of a 6000-count autoranging handheld multimeter. No manual is named: every value below is
// from memory, typical of that class of meter (DC V input 10 MΩ; resistance by a constant test current per range;
// diode test by ≈1 mA constant current with OL near 3 V; continuity beep below a few tens of ohms). The meter is
// connected in the ngspice deck as what it is electrically, so ngspice computes the value it would show:
//   DC V        10 MΩ between the probes; the reading is the mean of V(red) − V(black) over whole mains cycles
//               when the board is fed from AC (a dual-slope/sigma-delta DC meter averages: common practice);
//   Ω           a current source per range from black into red, with a compliance clamp near 1.3–1.5 V; the meter
//               autoranges up from its lowest range and shows the first range that is not overloaded;
//   diode       1 mA with a ≈3.5 V compliance clamp; above 2.999 V it shows OL (an open circuit does);
//   continuity  the lowest Ω range's current; beeps below 30 Ω.
// Noise: each reading gets the meter's ±(% of reading + digits) split into a calibration error fixed per job and
// range (half the % term) and a per-reading digit error, then is rounded to the range's resolution.
import { at, boardState, injectFaults, withMeter, withSource, type FaultSpec } from './deck';
import { simulate, type OpBlock } from './ngspice';

export type MeterMode = 'dcv' | 'ohm' | 'diode' | 'continuity';
export interface Probe {
  mode: MeterMode;
  red: string;
  black: string;
  power: 'on' | 'off';
  lifted?: readonly string[];
}

export interface Range {
  full: number;
  resolution: number;
  pct: number;
  digits: number;
  current?: number;
}

export const METER = {
  name: 'bench handheld, 6000 counts, autoranging (values from memory)',
  dcvInput: 10e6,
  dcv: [
    { full: 0.5999, resolution: 1e-4, pct: 0.5, digits: 3 },
    { full: 5.999, resolution: 1e-3, pct: 0.5, digits: 3 },
    { full: 59.99, resolution: 1e-2, pct: 0.5, digits: 3 },
    { full: 599.9, resolution: 0.1, pct: 0.5, digits: 3 },
    { full: 1000, resolution: 1, pct: 0.8, digits: 3 },
  ] as Range[],
  ohm: [
    { full: 599.9, resolution: 0.1, pct: 0.9, digits: 5, current: 5e-4 },
    { full: 5999, resolution: 1, pct: 0.9, digits: 5, current: 5e-5 },
    { full: 59990, resolution: 10, pct: 0.9, digits: 5, current: 5e-6 },
    { full: 599900, resolution: 100, pct: 0.9, digits: 5, current: 5e-7 },
    { full: 5.999e6, resolution: 1e3, pct: 0.9, digits: 5, current: 5e-8 },
    { full: 59.99e6, resolution: 1e4, pct: 1.5, digits: 10, current: 1e-8 },
  ] as Range[],
  diode: { full: 2.999, resolution: 1e-3, pct: 1.5, digits: 3, current: 1e-3 } as Range,
  continuityThreshold: 30,
};

/**
 * The Thevenin test sources the engine is told the meter has (engine-meter.ts). `--meter thevenin` puts exactly
 * these in the deck instead of the constant-current meter, so that a failure left in that run is not a
 * disagreement between the two meter models.
 */
export const THEVENIN = {
  ohm: { voc: 0.5, rs: 10e3 },
  continuity: { voc: 1.5, rs: 3e3 },
  diode: { voc: 3.5, rs: 2.9e3 },
};

export type MeterStyle = 'constant-current' | 'thevenin';

// Compliance clamps: a junction with a tiny saturation current stays far below a test current until the probe
// voltage nears its knee (ngspice gives ≈1.49 V at 0.5–1 mA); the diode test's clamp sits on a 2 V source so an
// open circuit reads ≈3.5 V, above the 2.999 V display (OL).
const CLAMP_MODEL = '.model DMTRCLAMP D(is=1e-30)';

export interface BenchBoardLike {
  netlist: (params: Record<string, number>) => string;
  /** An AC mains source: powered DC V readings are the mean over mains cycles of a transient run. */
  mains?: { source: string; sin: string };
}

export interface TrueReading {
  /** What an ideal display would show before the meter's error (V or Ω; OL as 'OL'). */
  ideal: number | 'OL';
  value: number | 'OL' | boolean;
  range: number;
}

const node = (b: OpBlock, n: string) => (n === '0' || n === 'gnd' ? 0 : (b.get(n.toLowerCase()) ?? NaN));

export async function readMeter(
  board: BenchBoardLike,
  params: Record<string, number>,
  faults: readonly FaultSpec[],
  probe: Probe,
  rng: Noise,
  style: MeterStyle = 'constant-current',
): Promise<TrueReading> {
  let net = boardState(injectFaults(board.netlist(params), faults), { power: probe.power, lifted: probe.lifted });
  const { red, black } = probe;
  if (probe.mode === 'dcv') {
    const rm = `RMTRV ${red} ${black} ${METER.dcvInput}`;
    let v: number;
    if (board.mains && probe.power === 'on') {
      net = withSource(net, board.mains.source, board.mains.sin);
      const meas = (n: string, tag: string) => (n === '0' ? [] : [`meas tran m_${tag} avg v(${n}) from=100m to=200m`]);
      const r = await simulate(withMeter(net, [rm], ['tran 20u 200m 0 20u', ...meas(red, 'red'), ...meas(black, 'black')]));
      v = (red === '0' ? 0 : r.measures.get('m_red')!) - (black === '0' ? 0 : r.measures.get('m_black')!);
    } else {
      const r = await simulate(withMeter(net, [rm], ['op', 'print all']));
      v = node(at(r.ops, 0), red) - node(at(r.ops, 0), black);
    }
    return display(v, METER.dcv, rng, 'dcv');
  }
  if (style === 'thevenin') return readThevenin(net, probe, rng);
  if (probe.mode === 'diode') {
    const els = [CLAMP_MODEL, `IMTR ${black} ${red} DC ${METER.diode.current}`, `DMTR1 ${red} mtr_k DMTRCLAMP`, `VMTRCL mtr_k ${black} DC 2`];
    const r = await simulate(withMeter(net, els, ['op', 'print all']));
    const v = node(at(r.ops, 0), red) - node(at(r.ops, 0), black);
    return display(v, [METER.diode], rng, 'diode');
  }
  // Ω and continuity: one run computes every range (the test current changed with `alter` between operating points).
  const ranges = probe.mode === 'ohm' ? METER.ohm : METER.ohm.slice(0, 1);
  const control = ranges.flatMap((rg, i) => [...(i ? [`alter imtr dc = ${rg.current}`] : []), 'op', 'print all']);
  const els = [CLAMP_MODEL, `IMTR ${black} ${red} DC ${at(ranges, 0).current}`, `DMTR1 ${red} ${black} DMTRCLAMP`];
  const r = await simulate(withMeter(net, els, control));
  const ohms = ranges.map((rg, i) => (node(at(r.ops, i), red) - node(at(r.ops, i), black)) / rg.current!);
  const k = ohms.findIndex((x, i) => x <= at(ranges, i).full);
  if (probe.mode === 'continuity') {
    if (k < 0) return { ideal: 'OL', value: false, range: 0 };
    const shown = noisy(at(ohms, 0), at(ranges, 0), rng, 'ohm0');
    return { ideal: at(ohms, 0), value: shown < METER.continuityThreshold, range: 0 };
  }
  if (k < 0) return { ideal: 'OL', value: 'OL', range: ranges.length - 1 };
  const shown = noisy(at(ohms, k), at(ranges, k), rng, `ohm${k}`);
  return { ideal: at(ohms, k), value: shown > at(ranges, k).full ? 'OL' : shown, range: k };
}

async function readThevenin(net: string, probe: Probe, rng: Noise): Promise<TrueReading> {
  if (probe.mode === 'dcv') throw new Error('DC V has no test source');
  const src = THEVENIN[probe.mode];
  const els = [`VMTR mtr_s ${probe.black} DC ${src.voc}`, `RMTRS mtr_s ${probe.red} ${src.rs}`];
  const r = await simulate(withMeter(net, els, ['op', 'print all']));
  const v = node(at(r.ops, 0), probe.red) - node(at(r.ops, 0), probe.black);
  if (probe.mode === 'diode') return display(v, [METER.diode], rng, 'diode');
  const ohms = v / ((src.voc - v) / src.rs);
  if (probe.mode === 'continuity') {
    const lowest = at(METER.ohm, 0);
    return { ideal: ohms > lowest.full ? 'OL' : ohms, value: noisy(ohms, lowest, rng, 'ohm0') < METER.continuityThreshold, range: 0 };
  }
  return display(ohms, METER.ohm, rng, 'ohm');
}

function display(v: number, ranges: readonly Range[], rng: Noise, fn: string): TrueReading {
  // An open circuit under a Thevenin ohmmeter gives Infinity: that is OL; NaN is a probe node the deck lacks.
  if (Number.isNaN(v)) throw new Error('no value for a probe node (check the net names)');
  const k = ranges.findIndex((rg) => Math.abs(v) <= rg.full);
  if (k < 0) return { ideal: 'OL', value: 'OL', range: ranges.length - 1 };
  const shown = noisy(v, at(ranges, k), rng, `${fn}${k}`);
  return { ideal: v, value: Math.abs(shown) > at(ranges, k).full ? 'OL' : shown, range: k };
}

function noisy(x: number, rg: Range, rng: Noise, key: string): number {
  const gain = rng.fixed(key) * 0.5 * (rg.pct / 100);
  const digits = rng.next() * rg.digits;
  const y = x * (1 + gain) + digits * rg.resolution;
  // Rounded to the display's resolution (toFixed keeps 0.0982 from printing as 0.09820000000000001).
  const decimals = Math.max(0, -Math.floor(Math.log10(rg.resolution) + 1e-9));
  return Number((Math.round(y / rg.resolution) * rg.resolution).toFixed(decimals));
}

/** Seeded noise: `fixed(key)` is the same for a job (calibration error per range), `next()` differs per reading. */
export class Noise {
  private state: number;
  private readonly fixedValues = new Map<string, number>();
  constructor(private readonly seed: string) {
    this.state = hash(seed);
  }
  /** Uniform in [-1, 1). */
  next(): number {
    // mulberry32 (public-domain PRNG by Tommy Ettinger): enough for reproducible bench noise.
    this.state = (this.state + 0x6d2b79f5) | 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (((t ^ (t >>> 14)) >>> 0) / 4294967296) * 2 - 1;
  }
  fixed(key: string): number {
    if (!this.fixedValues.has(key)) this.fixedValues.set(key, new Noise(`${this.seed}/${key}`).next());
    return this.fixedValues.get(key)!;
  }
}

function hash(s: string): number {
  let h = 0x811c9dc5; // FNV-1a
  for (let i = 0; i < s.length; i += 1) h = Math.imul(h ^ s.charCodeAt(i), 0x01000193);
  return h >>> 0;
}
