/**
 * Diode and BJT .model cards → model parameters. Every parameter is one of: implemented (as ngspice does), accepted
 * and ignored because it cannot change a DC operating point at 27 °C (capacitances, transit times, noise,
 * temperature coefficients, which all multiply T − TNOM), or refused with a NetlistError naming the model, the
 * parameter and the line. Parameter names and aliases: ngspice manual ch. 7 (diode) and 8 (BJT), and the model
 * tables of src/spicelib/devices/dio/dio.c and bjt/bjt.c.
 */
import type { BjtModel, DiodeModel } from './circuit';
import { DEFAULT_BJT, DEFAULT_DIODE } from './circuit';
import { NOMINAL_TEMP } from './netlist';
import { NetlistError, type ModelDef } from './netlist-types';

/** Diode parameters without effect at DC and 27 °C (README lists them). */
export const DIODE_IGNORED = [
  'tt',
  'cjo',
  'cj0',
  'cj',
  'vj',
  'pb',
  'm',
  'mj',
  'fc',
  'fcs',
  'cjsw',
  'cjp',
  'vjsw',
  'php',
  'mjsw',
  'kf',
  'af',
  'eg',
  'xti',
  'trs',
  'trs1',
  'trs2',
  'tcv',
  'tbv1',
  'tbv2',
  'tm1',
  'tm2',
  'tt1',
  'tt2',
  'cta',
  'ctc',
  'ctp',
  'tpb',
  'tphp',
  'tlev',
  'tlevc',
  'xom',
  'xoi',
  'lm',
  'lp',
  'wm',
  'wp',
  'xw',
  'xp',
  'nr',
];

/** BJT parameters without effect at DC and 27 °C (README lists them). */
export const BJT_IGNORED = [
  'cje',
  'vje',
  'pe',
  'mje',
  'me',
  'tf',
  'xtf',
  'vtf',
  'itf',
  'ptf',
  'cjc',
  'vjc',
  'pc',
  'mjc',
  'mc',
  'xcjc',
  'tr',
  'cjs',
  'ccs',
  'csub',
  'vjs',
  'ps',
  'mjs',
  'ms',
  'fc',
  'kf',
  'af',
  'eg',
  'xti',
  'xtb',
  'tlev',
  'tlevc',
  'ns',
  'tre1',
  'tre2',
  'trc1',
  'trc2',
  'trb1',
  'trb2',
  'trm1',
  'trm2',
  'tbf1',
  'tbf2',
  'tbr1',
  'tbr2',
  'tikf1',
  'tikf2',
  'tikr1',
  'tikr2',
  'tirb1',
  'tirb2',
  'tnc1',
  'tnc2',
  'tne1',
  'tne2',
  'tnf1',
  'tnf2',
  'tnr1',
  'tnr2',
  'tvaf1',
  'tvaf2',
  'tvar1',
  'tvar2',
  'ctc',
  'cte',
  'cts',
  'tvjc',
  'tvje',
  'tvjs',
  'titf1',
  'titf2',
  'ttf1',
  'ttf2',
  'ttr1',
  'ttr2',
  'tmje1',
  'tmje2',
  'tmjc1',
  'tmjc2',
  'tmjs1',
  'tmjs2',
  'tis1',
  'tis2',
  'tise1',
  'tise2',
  'tisc1',
  'tisc2',
  'tiss1',
  'tiss2',
  'vceo',
  'icmax',
  'pdmax',
];

/** Refused parameters that do change DC, with what they model (for the message). */
const DIODE_REFUSED: Record<string, string> = {
  ikf: 'high-injection knee current',
  ik: 'high-injection knee current',
  ikr: 'reverse high-injection knee current',
  isw: 'sidewall saturation current',
  jsw: 'sidewall saturation current',
  nbv: 'breakdown emission coefficient',
  ibvl: 'low-level breakdown current',
  nbvl: 'low-level breakdown emission coefficient',
  gleak: 'leakage conductance',
  isr: 'recombination saturation current',
};
const BJT_REFUSED: Record<string, string> = {
  iss: 'substrate junction saturation current',
  ibe: 'separate B–E saturation current',
  ibc: 'separate B–C saturation current',
  rco: 'quasi-saturation',
  qco: 'quasi-saturation',
  vo: 'quasi-saturation',
  gamma: 'quasi-saturation',
  vg: 'quasi-saturation',
  cn: 'quasi-saturation',
  d: 'quasi-saturation',
};

type Eval = (key: string) => number;

function refuse(m: ModelDef, key: string, why: string): never {
  throw new NetlistError(m.line, `.model ${m.name}: parameter ${key.toUpperCase()} (${why}) changes the DC operating point and is not supported`);
}

/** Shared checks: LEVEL 1 only, TNOM 27 °C only, a refused or unknown parameter names itself. */
function common(m: ModelDef, key: string, x: Eval, ignored: readonly string[], refused: Record<string, string>): boolean {
  if (key === 'level') {
    if (x(key) !== 1) refuse(m, key, `model level ${x(key)}; level 1 is supported`);
    return true;
  }
  if (key === 'tnom' || key === 'tref') {
    if (x(key) !== NOMINAL_TEMP) refuse(m, key, `nominal temperature ${x(key)} °C; 27 °C is supported`);
    return true;
  }
  const why = refused[key];
  if (why !== undefined) refuse(m, key, why);
  if (ignored.includes(key)) return true;
  return false;
}

export function diodeModel(m: ModelDef, x: Eval): DiodeModel {
  const out: DiodeModel = { ...DEFAULT_DIODE };
  for (const key of Object.keys(m.params)) {
    if (key === 'is' || key === 'js') out.is = x(key);
    else if (key === 'n' || key === 'rs' || key === 'bv' || key === 'ibv') out[key] = x(key);
    else if (!common(m, key, x, DIODE_IGNORED, DIODE_REFUSED)) {
      throw new NetlistError(m.line, `.model ${m.name}: unknown diode parameter ${key.toUpperCase()}`);
    }
  }
  if (!(out.is > 0)) throw new NetlistError(m.line, `.model ${m.name}: IS must be > 0`);
  if (!(out.n > 0)) throw new NetlistError(m.line, `.model ${m.name}: N must be > 0`);
  if (out.rs < 0) throw new NetlistError(m.line, `.model ${m.name}: RS must be >= 0`);
  if (!(out.bv > 0)) throw new NetlistError(m.line, `.model ${m.name}: BV must be > 0`);
  return out;
}

/** ngspice reads 0 for VAF, VAR, IKF, IKR and IRB as "none" (bjttemp.c: the inverse is 0). */
const ZERO_IS_NONE = new Set(['vaf', 'var', 'ikf', 'ikr', 'irb']);
const BJT_ALIASES: Record<string, keyof Omit<BjtModel, 'type'>> = { va: 'vaf', vb: 'var', ik: 'ikf', c2: 'ise', c4: 'isc' };
const BJT_KEYS = new Set(Object.keys(DEFAULT_BJT).filter((k) => k !== 'subs'));

export function bjtModel(m: ModelDef, x: Eval): BjtModel {
  // ngspice's default substrate connection: vertical for NPN, lateral for PNP (checked against ngspice 39 decks)
  const out: BjtModel = { type: m.type === 'pnp' ? 'pnp' : 'npn', ...DEFAULT_BJT, subs: m.type === 'pnp' ? -1 : 1 };
  let c2: number | undefined;
  let c4: number | undefined;
  for (const key of Object.keys(m.params)) {
    const k = BJT_ALIASES[key] ?? key;
    if (key === 'c2') c2 = x(key);
    else if (key === 'subs') out.subs = x(key) === -1 ? -1 : 1;
    else if (key === 'c4') c4 = x(key);
    else if (BJT_KEYS.has(k)) {
      const v = x(key);
      (out as unknown as Record<string, number>)[k] = ZERO_IS_NONE.has(k) && v === 0 ? Infinity : v;
    } else if (!common(m, key, x, BJT_IGNORED, BJT_REFUSED)) {
      throw new NetlistError(m.line, `.model ${m.name}: unknown BJT parameter ${key.toUpperCase()}`);
    }
  }
  // SPICE2's C2 and C4 are multiples of IS (ngspice bjtsetup.c: ISE = C2·IS when ISE is not given)
  if (c2 !== undefined && !('ise' in m.params)) out.ise = c2 * out.is;
  if (c4 !== undefined && !('isc' in m.params)) out.isc = c4 * out.is;
  if (Number.isNaN(out.rbm)) out.rbm = out.rb;
  for (const k of ['is', 'bf', 'br', 'nf', 'nr', 'ne', 'nc', 'vaf', 'var', 'ikf', 'ikr', 'irb', 'nkf'] as const) {
    if (!(out[k] > 0)) throw new NetlistError(m.line, `.model ${m.name}: ${k.toUpperCase()} must be > 0`);
  }
  for (const k of ['rb', 'rc', 're', 'rbm', 'ise', 'isc'] as const) {
    if (!(out[k] >= 0)) throw new NetlistError(m.line, `.model ${m.name}: ${k.toUpperCase()} must be >= 0`);
  }
  return out;
}
