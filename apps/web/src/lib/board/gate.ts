// The discharge gate's rule on a drawable board: the contract's functions, which the server applies too.
import { DEFAULT_SAFE_THRESHOLD } from '@splitscope/boards/references';
import { dischargeGateRefusal, probesTouchBus } from '@splitscope/contract';
import type { BoardView } from './board-view';

interface Probe {
  red: string;
  black: string;
  power: 'on' | 'off';
}

/** Whether a test is on a section that touches the bus: the contract's rule, which the server enforces too. */
export function touchesBus(view: BoardView, t: Pick<Probe, 'red' | 'black'>): boolean {
  return probesTouchBus({ testPoints: view.points, sections: view.sections }, t.red, t.black);
}

/** Why the discharge gate refuses this reading (the contract's rule, the server's too), or null. */
export function gateRefusalFor(view: BoardView, r: Probe & { safetyCheck?: { unplugged: boolean; busVolts: number } }): string | null {
  return dischargeGateRefusal({ testPoints: view.points, sections: view.sections }, r, DEFAULT_SAFE_THRESHOLD);
}
