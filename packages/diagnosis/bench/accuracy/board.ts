// What a bench board section is, and the kinds of its parts. Kinds are given explicitly to the engine (as a
// shop's board model would), read from the designator letter and the value, with the exceptions each board names.
import type { PartKind, TestPoint } from '../../src/index';
import { spiceNumber } from './deck';
import type { BenchBoardLike } from './meter';

export interface BenchBoard extends BenchBoardLike {
  id: string;
  title: string;
  /** Default parameter values (e.g. whether the controller commands the fan on). */
  defaults: Record<string, number>;
  /** Kinds that the designator letter does not tell (LEDs, opto-couplers, regulators). */
  kindOverrides?: Record<string, PartKind>;
  testPoints: TestPoint[];
  /** Nets the board names as its AC mains input (the engine is told, as a board model would tell it). */
  acMains?: string[];
}

/** Common practice: aluminium electrolytics from about 1 µF up, ceramics below. */
const ELECTROLYTIC_FROM = 1e-6;

export function partKinds(board: BenchBoard, params: Record<string, number>): Record<string, { kind: PartKind }> {
  const kinds: Record<string, { kind: PartKind }> = {};
  let depth = 0;
  for (const [i, raw] of board.netlist(params).split('\n').entries()) {
    const l = raw.trim();
    if (/^\.subckt/i.test(l)) depth += 1;
    if (/^\.ends/i.test(l)) depth -= 1;
    if (i === 0 || depth > 0 || !/^[a-z]/i.test(l)) continue;
    const [name = '', , , value = ''] = l.split(/\s+/);
    const kind = board.kindOverrides?.[name] ?? kindOf(name, value);
    if (kind) kinds[name] = { kind };
  }
  return kinds;
}

function kindOf(name: string, value: string): PartKind | undefined {
  switch (name.charAt(0).toUpperCase()) {
    case 'R':
      return 'resistor';
    case 'C':
      return spiceNumber(value) >= ELECTROLYTIC_FROM ? 'electrolytic-capacitor' : 'ceramic-capacitor';
    case 'D':
      return 'diode';
    case 'Q':
      return 'bjt';
    case 'L':
      return 'inductor';
    case 'V':
    case 'I':
      return 'source';
    default:
      return undefined;
  }
}

/** The opto-coupler as the bench writes it: LED, a current-controlled current source (CTR) and a phototransistor. */
export const OPTO_SUBCKT = `.model DOLED D(is=1e-20 n=1.8)
.model QOPT NPN(is=1e-14 bf=250)
.subckt OPTOC a k c e
VSEN a ai 0
DLED ai k DOLED
FCT e pb VSEN 0.008
QPT c pb e QOPT
RPB pb e 20meg
.ends`;

export const tp = (label: string, net: string, ref = '0'): TestPoint => ({ label, net, ...(ref === '0' ? {} : { ref }) });
