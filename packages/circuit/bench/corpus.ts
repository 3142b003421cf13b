/**
 * Seeded robustness corpus: netlists of the kinds a mini-split control board is made of (resistor meshes with wide
 * ratios, diode clamps, NPN/PNP stages, opto-isolated stages with a floating cold side, series-pass regulators,
 * mains bridges), each in four states: powered, powered with parts lifted, unpowered with a meter attached (ohms,
 * diode test or a 10 MΩ voltmeter), unpowered with parts lifted. Every deck is complete SPICE: both ngspice and this
 * package solve the same text. Nodes a state leaves without a DC path get an explicit 1 TΩ to the reference (what
 * the engine adds to islands of a derived state), so the deck is valid for both.
 */
import { flatten, nodesWithoutDcPath, parseNetlist } from '../src/index';
import { rng } from './random';

interface Part {
  name: string;
  lines: string[];
  /** An independent source: removed when the board is unpowered. */
  source?: boolean;
  /** May be lifted (not a source, not the meter). */
  liftable?: boolean;
}

interface Base {
  kind: string;
  parts: Part[];
  models: string[];
  nodes: string[];
}

export interface CorpusCase {
  name: string;
  kind: string;
  state: string;
  deck: string;
}

type R = () => number;
const pick = <T>(r: R, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)] as T;
const logU = (r: R, lo: number, hi: number) => lo * Math.pow(hi / lo, r());
const fmt = (x: number) => x.toPrecision(4);

const OPTO = [
  '.subckt OPTO a k c e',
  'VS a an 0',
  'DL an k DOPTO',
  'FP c b VS 0.00646766',
  'QP c b e QPHOTO',
  '.model DOPTO D(IS=1.7e-12 N=2 RS=1)',
  '.model QPHOTO NPN(IS=1e-14 BF=200 BR=2)',
  '.ends OPTO',
];

/** Diode and BJT models with the DC parameters this package implements, drawn at random. */
function diodeModel(r: R, name: string): string {
  const ps = [`IS=${fmt(logU(r, 1e-15, 1e-8))}`, `N=${fmt(1 + r())}`];
  if (r() < 0.6) ps.push(`RS=${fmt(logU(r, 0.01, 20))}`);
  if (r() < 0.3) ps.push(`BV=${fmt(3 + 30 * r())}`, `IBV=${fmt(logU(r, 1e-6, 1e-2))}`);
  return `.model ${name} D(${ps.join(' ')})`;
}

function bjtModel(r: R, name: string, type: 'NPN' | 'PNP'): string {
  const ps = [`IS=${fmt(logU(r, 1e-16, 1e-13))}`, `BF=${fmt(30 + 300 * r())}`, `BR=${fmt(0.5 + 5 * r())}`];
  if (r() < 0.5) ps.push(`VAF=${fmt(20 + 150 * r())}`);
  if (r() < 0.3) ps.push(`VAR=${fmt(5 + 40 * r())}`);
  if (r() < 0.4) ps.push(`IKF=${fmt(logU(r, 1e-3, 1))}`);
  if (r() < 0.2) ps.push(`IKR=${fmt(logU(r, 1e-3, 1))}`);
  if (r() < 0.4) ps.push(`ISE=${fmt(logU(r, 1e-16, 1e-12))}`, `NE=${fmt(1.2 + r())}`);
  if (r() < 0.3) ps.push(`ISC=${fmt(logU(r, 1e-16, 1e-12))}`, `NC=${fmt(1.2 + r())}`);
  if (r() < 0.4) ps.push(`RB=${fmt(logU(r, 1, 500))}`, `RBM=${fmt(logU(r, 0.5, 1))}`);
  if (r() < 0.2) ps.push(`IRB=${fmt(logU(r, 1e-5, 1e-2))}`);
  if (r() < 0.3) ps.push(`RC=${fmt(logU(r, 0.1, 10))}`, `RE=${fmt(logU(r, 0.01, 2))}`);
  if (r() < 0.3) ps.push(`NF=${fmt(1 + 0.1 * r())}`);
  return `.model ${name} ${type}(${ps.join(' ')})`;
}

const res = (name: string, a: string, b: string, v: number): Part => ({ name, lines: [`${name} ${a} ${b} ${fmt(v)}`], liftable: true });
const src = (name: string, a: string, b: string, v: number): Part => ({ name, lines: [`${name} ${a} ${b} ${v === 0 ? '0' : fmt(v)}`], source: true });
const two = (name: string, a: string, b: string, model: string): Part => ({ name, lines: [`${name} ${a} ${b} ${model}`], liftable: true });
const q = (name: string, c: string, b: string, e: string, model: string): Part => ({ name, lines: [`${name} ${c} ${b} ${e} ${model}`], liftable: true });
const opto = (name: string, a: string, k: string, c: string, e: string): Part => ({ name, lines: [`${name} ${a} ${k} ${c} ${e} OPTO`], liftable: true });

function mesh(r: R): Base {
  const n = 4 + Math.floor(r() * 9);
  const node = (i: number) => (i === 0 ? '0' : `m${i}`);
  const parts: Part[] = [src('V1', 'm1', '0', pick(r, [5, 12, 15, 311]))];
  let k = 0;
  for (let i = 2; i <= n; i++) parts.push(res(`R${++k}`, node(Math.floor(r() * i)), node(i), logU(r, 1, 1e9)));
  for (let j = 0; j < n; j++) {
    const a = Math.floor(r() * (n + 1));
    const b = Math.floor(r() * (n + 1));
    if (a !== b) parts.push(res(`R${++k}`, node(a), node(b), logU(r, 1, 1e9)));
  }
  for (let j = 0; j < Math.ceil(n / 3); j++) {
    const a = 1 + Math.floor(r() * n);
    const b = Math.floor(r() * (n + 1));
    if (a !== b) parts.push(two(`D${j + 1}`, node(a), node(b), 'DM'));
  }
  return { kind: 'mesh', parts, models: [diodeModel(r, 'DM')], nodes: Array.from({ length: n }, (_, i) => node(i + 1)) };
}

function clamp(r: R): Base {
  const parts = [
    src('VIN', 'in', '0', -30 + 60 * r()),
    src('VCC', 'vcc', '0', pick(r, [3.3, 5, 15])),
    res('RS', 'in', 'a', logU(r, 100, 1e5)),
    two('D1', 'a', 'vcc', 'DS'),
    two('D2', '0', 'a', 'DS'),
    two('DZ', '0', 'a', 'DZ'),
    res('RL', 'a', 'out', logU(r, 1e3, 1e6)),
    res('RP', 'out', '0', logU(r, 1e3, 1e7)),
    res('RV', 'vcc', '0', logU(r, 100, 1e4)),
  ];
  const bv = 3 + 12 * r();
  return {
    kind: 'clamp',
    parts,
    models: [diodeModel(r, 'DS'), `.model DZ D(IS=1e-14 N=1 BV=${fmt(bv)} IBV=1m RS=${fmt(logU(r, 0.5, 20))})`],
    nodes: ['in', 'vcc', 'a', 'out'],
  };
}

function stage(r: R): Base {
  const vcc = pick(r, [5, 12, 15, 24]);
  const parts = [
    src('VCC', 'vcc', '0', vcc),
    src('VIN', 'in', '0', 5 * r()),
    res('RB1', 'in', 'b', logU(r, 1e3, 1e5)),
    res('RB2', 'b', '0', logU(r, 1e3, 1e6)),
    q('Q1', 'c', 'b', 'e', 'QN'),
    res('RC', 'vcc', 'c', logU(r, 100, 1e4)),
    res('RE', 'e', '0', logU(r, 1, 1e3)),
    res('RPB', 'vcc', 'pb', logU(r, 1e3, 1e5)),
    res('RPD', 'pb', 'c', logU(r, 1e3, 1e4)),
    q('Q2', 'out', 'pb', 'vcc', 'QP'),
    res('RL', 'out', '0', logU(r, 100, 1e4)),
  ];
  return { kind: 'bjt-stage', parts, models: [bjtModel(r, 'QN', 'NPN'), bjtModel(r, 'QP', 'PNP')], nodes: ['vcc', 'in', 'b', 'c', 'e', 'pb', 'out'] };
}

function optoStage(r: R): Base {
  const tie = logU(r, 1e8, 1e11);
  const parts = [
    src('VHOT', 'vh', '0', pick(r, [12, 15, 24])),
    src('VCC', 'vcc', 'cgnd', pick(r, [3.3, 5])),
    res('RISO', 'cgnd', '0', tie),
    src('VP1', 'p1', 'cgnd', r() < 0.5 ? 0 : 5),
    res('R1', 'p1', 'a1', logU(r, 220, 4.7e3)),
    opto('XU1', 'a1', 'cgnd', 'c1', 'e1'),
    res('RC1', 'vh', 'c1', logU(r, 1e3, 1e5)),
    res('RE1', 'e1', '0', logU(r, 1e3, 1e5)),
    res('RB', 'e1', 'qb', logU(r, 470, 1e4)),
    q('Q1', 'load', 'qb', '0', 'QN'),
    res('RLOAD', 'vh', 'load', logU(r, 100, 2e3)),
    res('RF', 'vh', 'fa', logU(r, 1e3, 1e4)),
    opto('XU2', 'fa', 'load', 'fb', 'cgnd'),
    res('RPU', 'vcc', 'fb', logU(r, 4.7e3, 1e5)),
  ];
  return { kind: 'opto', parts, models: [bjtModel(r, 'QN', 'NPN')], nodes: ['vh', 'vcc', 'cgnd', 'p1', 'a1', 'c1', 'e1', 'qb', 'load', 'fa', 'fb'] };
}

function regulator(r: R): Base {
  const vin = pick(r, [18, 24, 30, 311]);
  const bv = pick(r, [5.6, 6.2, 8.2, 15.6]);
  const parts = [
    src('VIN', 'vin', '0', vin),
    res('RDROP', 'vin', 'in', logU(r, 1, 1e4)),
    res('RBIAS', 'in', 'zb', logU(r, 1e3, 1e5)),
    two('DZ', '0', 'zb', 'DZ'),
    q('Q1', 'in', 'zb', 'm', 'QN'),
    res('RM', 'm', 'out', logU(r, 100, 1e4)),
    q('Q2', 'in', 'm', 'out', 'QN'),
    res('RLOAD', 'out', '0', logU(r, 50, 1e5)),
    res('RQ', 'out', '0', logU(r, 1e4, 1e5)),
  ];
  if (r() < 0.5) parts.push(res('RSENSE', 'out', 'sense', logU(r, 0.5, 10)), q('QL', 'zb', 'out', 'sense', 'QN'), res('RLL', 'sense', '0', logU(r, 100, 1e4)));
  return { kind: 'regulator', parts, models: [bjtModel(r, 'QN', 'NPN'), `.model DZ D(IS=1e-14 N=1 BV=${bv} IBV=1m)`], nodes: ['vin', 'in', 'zb', 'm', 'out'] };
}

function bridge(r: R): Base {
  const parts = [
    src('VL', 'l', 'n', pick(r, [120, 230, 311, 340])),
    two('D1', 'l', 'busp', 'DR'),
    two('D2', 'n', 'busp', 'DR'),
    two('D3', '0', 'l', 'DR'),
    two('D4', '0', 'n', 'DR'),
    res('RBL', 'busp', '0', logU(r, 1e5, 1e6)),
    res('RZ', 'busp', 'zb', logU(r, 1e4, 1e5)),
    two('DZ1', '0', 'zb', 'DZ'),
    q('QREG', 'busp', 'zb', 'v15', 'QN'),
    res('RL15', 'v15', '0', logU(r, 1e3, 1e4)),
  ];
  if (r() < 0.5) parts.push(res('RX', 'l', 'n', logU(r, 1e6, 1e9)));
  return {
    kind: 'bridge',
    parts,
    models: [diodeModel(r, 'DR'), '.model DZ D(IS=1e-14 N=1 BV=15.6 IBV=1m)', bjtModel(r, 'QN', 'NPN')],
    nodes: ['l', 'n', 'busp', 'zb', 'v15'],
  };
}

const KINDS = [mesh, clamp, stage, optoStage, regulator, bridge];

/** The meter of an unpowered reading, or a voltmeter of a powered one, between two random nodes. */
function meter(r: R, nodes: readonly string[], powered: boolean): Part {
  const red = pick(r, nodes);
  const black =
    r() < 0.5
      ? '0'
      : pick(
          r,
          nodes.filter((n) => n !== red),
        );
  if (powered) return { name: 'RMETER', lines: [`RMETER ${red} ${black} 10MEG`] };
  const [v, rs] = pick(r, [
    [0.5, 10e3],
    [3, 2.4e3],
    [0.5, 1e3],
    [2.5, 250e3],
  ] as const);
  return { name: 'VMETER', lines: [`VMETER msrc ${black} ${v}`, `RMETER msrc ${red} ${fmt(rs)}`] };
}

function deckOf(title: string, base: Base, parts: Part[]): string {
  const body = [title, ...(base.kind === 'opto' ? OPTO : []), ...base.models, ...parts.flatMap((p) => p.lines)];
  // nodes a state leaves without a DC path: 1 TΩ to the reference (as the engine does for islands)
  const circuit = flatten(parseNetlist(body.join('\n') + '\n'), {}, { checkDcPaths: false });
  const islands = nodesWithoutDcPath(circuit.elements).filter((n) => !n.includes('.'));
  islands.forEach((n, i) => body.push(`RISLAND${i} ${n} 0 1T`));
  return body.join('\n') + '\n.op\n.end\n';
}

/** `count` bases × 4 states, from `seed`. */
export function corpus(seed: number, count: number): CorpusCase[] {
  const r = rng(seed);
  const out: CorpusCase[] = [];
  for (let i = 0; i < count; i++) {
    const kindFn = KINDS[i % KINDS.length] as (r: R) => Base;
    const base = kindFn(r);
    for (const state of ['powered', 'powered-lifted', 'unpowered', 'unpowered-lifted']) {
      const powered = state.startsWith('powered');
      let parts = powered ? [...base.parts] : base.parts.filter((p) => !p.source || / 0$/.test(p.lines[0] as string));
      if (state.endsWith('lifted')) {
        const liftable = parts.filter((p) => p.liftable);
        const lift = new Set([pick(r, liftable).name, ...(r() < 0.4 ? [pick(r, liftable).name] : [])]);
        parts = parts.filter((p) => !lift.has(p.name));
      }
      if (!powered || r() < 0.5) parts.push(meter(r, base.nodes, powered));
      const name = `${base.kind}-${i}-${state}`;
      out.push({ name, kind: base.kind, state, deck: deckOf(`${name} (seed ${seed})`, base, parts) });
    }
  }
  return out;
}
