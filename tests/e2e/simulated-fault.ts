// The bench's stand-in for a failed board: the diagnosis engine's own circuit model with one fault applied,
// read the way the meter would. The browser test types these values, so the ranking has to find the fault
// from physics, not from a script that knows the answer's section.
import type { JobDetail } from '@splitscope/contract';
// A test may reach into the engine's source; the root package does not depend on the engine packages.
import { createDiagnoser } from '../../packages/diagnosis/src/index';
import { probeNet, typed } from './helpers';

export interface Probe {
  mode: 'dcv' | 'ohm' | 'diode' | 'continuity';
  red: string;
  black: string;
  power: 'on' | 'off';
  lifted?: string[];
}

export interface Fault {
  component: string;
  mode: string;
  /** The fault's parameter, e.g. a short's resistance in ohms. */
  value: number;
}

/** What a technician would type for each probe on this job's board with `fault` in it. */
export function faultedBoard(job: JobDetail, fault: Fault): (t: Probe) => string {
  const doc = job.board.document as { netlist: string; params?: Record<string, number> };
  const d = createDiagnoser({ netlist: doc.netlist, params: doc.params });
  const net = (p: string) => probeNet(job, p);
  return (t) => {
    const test = { mode: t.mode, red: net(t.red), black: net(t.black), power: t.power, lifted: [...(t.lifted ?? [])].sort() };
    const [p] = d.model.predict([{ component: fault.component, mode: fault.mode, point: 0, value: fault.value }], [test]);
    if (!p || p.value === 'unknown') throw new Error(`the model cannot predict ${JSON.stringify(test)}`);
    if (t.mode === 'continuity') return typed(p.beep ?? false);
    return typed(p.value);
  };
}
