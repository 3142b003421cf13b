/**
 * The fault dictionary built through fast fault simulation (src/electrical/fast-predict.ts: the meter attached to
 * the healthy factors per test, each fault a Woodbury update; @splitscope/circuit fault-meter.ts) on both demo
 * boards: every offered test, a sample of the single faults (every mode, both ends of its sweep, spread over the
 * parts), each equal to a full solve of the faulted board from scratch (the circuit package's `measure`, no warm
 * start). Tolerance: ngspice's defaults RELTOL 1e-3 and VNTOL 1 µV (ngspice manual, ch. 15 ".options"), the
 * convergence test of the circuit package's Newton; for a resistance reading RELTOL alone (an ohmmeter reads
 * V/I, each solved to RELTOL). An OL, a "does not solve" or an AC-mains reading must match exactly. Where the
 * solve from scratch finds no operating point at all (a few diode tests across a shorted bus resistor on the
 * indoor board), the reference is the model's own full solve warm-started from the healthy board (model.ts
 * `predict`, what the dictionary stored before the fast path).
 */
import { describe, expect, it } from 'vitest';
import { measure, type MeterProfile } from '@splitscope/circuit';
import { INDOOR_FAN_BOARD, OUTDOOR_FAN_BOARD } from '../../boards/src/demo';
import { applyFaults, createDiagnoser, encodePrediction, type SubFault } from '../src/index.js';
import { dictionaryTests, singleFaultsByPart } from '../src/electrical/dictionary.js';
import { FastPredictor } from '../src/electrical/fast-predict.js';
import type { ElectricalModel, ElectricalTest } from '../src/electrical/model.js';

const RELTOL = 1e-3;
const VNTOL = 1e-6;

/** The first and last sweep point of each part's mode (the extremes the dictionary holds). */
function ends(faults: SubFault[]): SubFault[] {
  const byMode = new Map<string, SubFault[]>();
  for (const f of faults) byMode.set(`${f.component}:${f.mode}`, [...(byMode.get(`${f.component}:${f.mode}`) ?? []), f]);
  return [...byMode.values()].flatMap((l) => (l.length > 1 ? [l[0]!, l[l.length - 1]!] : l));
}

/** The reading of the faulted board solved from scratch, encoded as the dictionary stores it. */
function fromScratch(model: ElectricalModel, f: SubFault, t: ElectricalTest, meter: MeterProfile): number {
  if (t.mode === 'dcv' && (model.hazards.ac.has(t.red) || model.hazards.ac.has(t.black))) return -Infinity;
  try {
    const m = measure(applyFaults(model.stateCircuit(t), [f], model.partsByName), t, meter);
    return m.value === 'OL' ? Infinity : m.value;
  } catch {
    return NaN;
  }
}

describe.each([
  ['outdoor fan board', OUTDOOR_FAN_BOARD, 6],
  ['indoor fan board', INDOOR_FAN_BOARD, 24],
])('dictionary predictions by fast fault simulation on the %s', (name, board, every) => {
  it('equal a full solve from scratch on every offered test', () => {
    const d = createDiagnoser({ netlist: board.netlist, testPoints: board.testPoints });
    const model = d.model;
    const tests = dictionaryTests(d);
    // every mode's sweep ends, every `every`-th of them: each mode and part kind is met, at a fraction of the time
    const faults = ends(singleFaultsByPart(model).flat()).filter((_f, i) => i % every === 0);
    const fast = new FastPredictor(model);
    const off: string[] = [];
    for (const f of faults) {
      fast.predict([f], tests).forEach((p, i) => {
        const t = tests[i]!;
        const got = encodePrediction(p);
        const scratch = fromScratch(model, f, t, model.meter);
        const want = Number.isNaN(scratch) ? encodePrediction(model.predict([f], [t])[0]!) : scratch;
        const ok =
          Number.isFinite(got) && Number.isFinite(want)
            ? Math.abs(got - want) <= RELTOL * Math.max(Math.abs(got), Math.abs(want)) + (t.mode === 'dcv' || t.mode === 'diode' ? VNTOL : 0)
            : Object.is(got, want);
        if (!ok) off.push(`${f.component} ${f.mode} ${f.value ?? ''} · ${t.mode} ${t.red}–${t.black} ${t.power} ${t.lifted.join(',')}: ${got} vs ${want}`);
      });
    }
    console.log(`${name}: ${faults.length} faults × ${tests.length} tests, ${JSON.stringify(fast.counts)}`);
    expect(off.slice(0, 20)).toEqual([]);
    // most predictions come from the healthy factors (the point of the fast build)
    expect(fast.counts.fast).toBeGreaterThan(fast.counts.full + fast.counts.fallback);
  }, 300_000);
});
