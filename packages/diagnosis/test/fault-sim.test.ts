/**
 * Fast fault simulation (@splitscope/circuit fault-sim.ts: Woodbury updates of the healthy factors, Newton
 * continued from the healthy solution) against full solves on both demo boards: every single sub-fault the
 * diagnosis simulates, written into the board in two states (powered; unpowered with an ohmmeter's test source
 * on a test point), every net compared. "Equal" is within the ngspice defaults of the DC operating point (ngspice
 * manual, ch. 15 ".options": RELTOL 1e-3, VNTOL 1 µV, ABSTOL 1 pA): |v' − v| ≤ RELTOL·max(|v|, |v'|) + VNTOL +
 * ABSTOL·R, R the net's driving-point resistance. ngspice accepts an operating point whose currents are within
 * ABSTOL, and a current error of ABSTOL moves a net by ABSTOL·R: the cold side of the indoor board hangs on a
 * 22 MΩ isolation resistor, where two correct solves (the full solver from two start points included) differ by
 * a few µV.
 */
import { describe, expect, it } from 'vitest';
import { HealthyFactor, resistor, rubberStamps, solveNodes, vsource, DEFAULT_METER, type Circuit } from '@splitscope/circuit';
import { INDOOR_FAN_BOARD, OUTDOOR_FAN_BOARD } from '../../boards/src/demo';
import { applyFaults, createDiagnoser, type SubFault } from '../src/index.js';
import { singleFaultsByPart } from '../src/electrical/dictionary.js';

const RELTOL = 1e-3;
const VNTOL = 1e-6;
const ABSTOL = 1e-12;

/** The unpowered board with the ohmmeter's Thevenin test source (DEFAULT_METER) from `net` to the reference. */
function withOhmmeter(c: Circuit, net: string): Circuit {
  const { openCircuitVoltage, sourceResistance } = DEFAULT_METER.ohm;
  return { ...c, elements: [...c.elements, vsource('VMETER', 'meter#src', '0', openCircuitVoltage), resistor('RMETER', 'meter#src', net, sourceResistance)] };
}

/** The first and last sweep point of each part's mode: the extremes of what the dictionary simulates, at a third of the run time. */
function ends(faults: SubFault[]): SubFault[] {
  const byMode = new Map<string, SubFault[]>();
  for (const f of faults) {
    const k = `${f.component}:${f.mode}`;
    byMode.set(k, [...(byMode.get(k) ?? []), f]);
  }
  return [...byMode.values()].flatMap((l) => (l.length > 1 ? [l[0]!, l[l.length - 1]!] : l));
}

describe.each([
  ['outdoor fan board', OUTDOOR_FAN_BOARD],
  ['indoor fan board', INDOOR_FAN_BOARD],
])('fast fault simulation on the %s', (_name, board) => {
  it('equals a full solve for every fault mode that is a conductance change (both ends of its sweep), powered and under the ohmmeter', () => {
    const d = createDiagnoser({ netlist: board.netlist, testPoints: board.testPoints });
    const model = d.model;
    const point = board.testPoints.find((p) => p.net.toLowerCase() !== '0')?.net.toLowerCase() as string;
    const states = [model.stateCircuit({ power: 'on', lifted: [] }), withOhmmeter(model.stateCircuit({ power: 'off', lifted: [] }), point)];
    const count = { woodbury: 0, 'newton-woodbury': 0, full: 0, notStamps: 0, unsolved: 0 };
    for (const state of states) {
      const hf = HealthyFactor.prepare(state);
      expect(hf).toBeDefined();
      for (const f of ends(singleFaultsByPart(model).flat())) {
        const faulted = applyFaults(state, [f], model.partsByName);
        const stamps = rubberStamps(state, faulted);
        if (!stamps) {
          count.notStamps++;
          continue;
        }
        let full: ReturnType<typeof solveNodes>;
        try {
          full = solveNodes(faulted);
        } catch {
          count.unsolved++;
          continue;
        }
        const fast = (hf as HealthyFactor).solve(stamps);
        count[fast.method]++;
        for (const [net, v] of Object.entries(full.nodes())) {
          const got = fast.voltage(net);
          const tol = RELTOL * Math.max(Math.abs(got), Math.abs(v)) + VNTOL + ABSTOL * (hf as HealthyFactor).drivingPoint(net);
          expect(Math.abs(got - v), `${f.component} ${f.mode} ${f.value} at ${net}`).toBeLessThanOrEqual(tol);
        }
      }
    }
    console.log(`${_name}: ${JSON.stringify(count)}`);
    // the fast path carries most faults the stamps express (boards with junctions go through Newton)
    expect(count['newton-woodbury'] + count.woodbury).toBeGreaterThan(count.full);
  }, 120_000);
});
