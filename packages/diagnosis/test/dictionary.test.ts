/**
 * The fault dictionary (src/electrical/dictionary.ts): every stored prediction equals a full solve of the faulted
 * board from scratch (the circuit package's `measure`, no warm start) to the solver's tolerance; a diagnoser that
 * reads the dictionary simulates no single fault and, once its pairs are delivered, ranks as one that simulates.
 * Tolerance: ngspice's defaults RELTOL 1e-3 and VNTOL 1 µV (ngspice manual, .options), the convergence test the
 * circuit package's Newton applies (packages/circuit README).
 */
import { describe, expect, it, vi } from 'vitest';
import { measure } from '@splitscope/circuit';
import {
  applyFaults,
  attachDictionary,
  buildDictionary,
  computePairs,
  addPairs,
  createDiagnoser,
  decodePrediction,
  encodePrediction,
  fromBytes,
  takeWantedPairs,
  toBytes,
} from '../src/index.js';
import { singleFaultsByPart } from '../src/electrical/dictionary.js';
import { DEFAULT_METER } from '@splitscope/circuit';

// An invented 15 V rail with a zener-referenced pass transistor, its filter, a switched load and a clamp diode.
const NETLIST = `small rail board
VAUX aux 0 18
D1 aux in DREV
R1 in b 2.2k
DZ1 0 b DZ
Q1 in b v15 QN
C1 v15 0 100u
C2 v15 0 100n
R2 v15 0 10k
R3 v15 sw 1k
Q2 sw g 0 QN
R4 ctl g 4.7k
VCTL ctl 0 0
D2 0 sw DREV
.model DREV D(IS=1e-14 N=1)
.model DZ D(IS=1e-14 N=1 BV=15.6 IBV=1m)
.model QN NPN(IS=1e-14 BF=100)
.end`;
const POINTS = [
  { net: 'v15', label: 'TP1' },
  { net: 'sw', label: 'TP2' },
  { net: 'b', label: 'TP3' },
];
const board = () => createDiagnoser({ netlist: NETLIST, testPoints: POINTS });
const close = (a: number, b: number) => Math.abs(a - b) <= 1e-3 * Math.max(Math.abs(a), Math.abs(b)) + 1e-6;

describe('fault dictionary', () => {
  const d = board();
  const dict = buildDictionary(d);

  it('holds every single fault on every offered test, and each equals a full solve from scratch', () => {
    const faults = singleFaultsByPart(d.model).flat();
    expect(dict.faults.length).toBe(faults.length + 1);
    // Test points in every meter function (diode both ways) plus lifted parts on the rails.
    expect(dict.tests.some((t) => t.lifted.length > 0)).toBe(true);
    expect(new Set(dict.tests.map((t) => t.mode))).toEqual(new Set(['dcv', 'ohm', 'diode', 'continuity']));
    let compared = 0;
    dict.tests.forEach((t, r) => {
      const state = d.model.stateCircuit(t);
      [undefined, ...faults].forEach((f, c) => {
        const circuit = f ? applyFaults(state, [f], d.model.partsByName) : state;
        let full: number;
        try {
          const m = measure(circuit, t, DEFAULT_METER);
          full = m.value === 'OL' ? Infinity : m.value;
        } catch {
          full = NaN;
        }
        const stored = dict.rows[r]![c]!;
        if (Number.isFinite(full) && Number.isFinite(stored))
          expect(close(stored, full), `${t.mode} ${t.red}-${t.black} ${t.lifted.join(',')} ${dict.faults[c]}: ${stored} vs ${full}`).toBe(true);
        else expect(stored).toBe(full);
        compared++;
      });
    });
    expect(compared).toBe(dict.tests.length * dict.faults.length);
  }, 60_000);

  it('stores float64 values exactly (OL, no solve and mains included) and decodes continuity beeps from the threshold', () => {
    const xs = Float64Array.from([14.98, -0.6, Infinity, NaN, -Infinity, 0, 12.5]);
    expect(Array.from(fromBytes(toBytes(xs)))).toEqual(Array.from(xs));
    for (const p of [
      { value: 'OL' as const },
      { value: 3.3 },
      { value: 'unknown' as const, reason: 'ac-mains' as const },
      { value: 'unknown' as const, reason: 'no-solve' as const },
    ]) {
      expect(decodePrediction(encodePrediction(p), 'dcv', DEFAULT_METER)).toEqual(p);
    }
    expect(decodePrediction(12, 'continuity', DEFAULT_METER)).toEqual({ value: 12, beep: true });
    expect(decodePrediction(Infinity, 'continuity', DEFAULT_METER)).toEqual({ value: 'OL', beep: false });
  });

  it('an update read from the dictionary simulates no fault; with its pairs delivered it ranks as a simulating one', () => {
    const readings = [
      { mode: 'dcv' as const, red: 'v15', black: '0', power: 'on' as const, value: 0.3 },
      { mode: 'continuity' as const, red: 'v15', black: '0', power: 'off' as const, value: true },
    ];
    const fresh = board();
    attachDictionary(fresh, dict);
    // Fault predictions come from the model's predict(); the healthy board outside the dictionary is solved apart.
    const predict = vi.spyOn(fresh.model, 'predict');
    const first = fresh.update(readings);
    expect(predict.mock.calls.filter(([faults]) => faults.length > 0)).toEqual([]);
    predict.mockRestore();
    expect(first.checking?.candidates ?? 0).toBeGreaterThan(0);
    expect(first.candidates.some((c) => c.checking)).toBe(true);
    // Each delivery can move the ranking and call for more; a few rounds settle it.
    let second = first;
    for (let round = 0; round < 6; round++) {
      const work = takeWantedPairs(fresh);
      if (work.length === 0) break;
      addPairs(fresh, computePairs(fresh, work));
      second = fresh.update(readings);
    }
    expect(takeWantedPairs(fresh)).toEqual([]);
    expect(second.checking).toBeUndefined();
    const reference = board().update(readings);
    // Candidates tied in probability (C1 or C2 shorted) may list in either order: compared by name.
    const byText = new Map(second.candidates.map((c) => [c.words.text, c.probability]));
    for (const c of reference.candidates.filter((x) => x.probability > 1e-4))
      expect(Math.abs((byText.get(c.words.text) ?? 0) - c.probability), c.words.text).toBeLessThan(1e-3);
    expect(Math.abs(second.nextTests[0]!.expectedEntropy - reference.nextTests[0]!.expectedEntropy)).toBeLessThan(1e-3);
  }, 60_000);
});

describe('a lifted part on its own pins with a dictionary attached', () => {
  it('is simulated at once, not left as being checked: C2 alone at 1 Ω makes "C2 — shorted" the diagnosis', () => {
    const d = board();
    attachDictionary(d, buildDictionary(d));
    // C2 (100 nF, v15 to 0) lifted and measured alone: no dictionary row holds this test.
    const out = d.update([{ mode: 'ohm', red: 'v15', black: '0', power: 'off', lifted: ['C2'], alone: 'C2', value: 1 }]);
    expect(out.candidates[0]!.faults).toEqual([{ part: 'C2', mode: 'short' }]);
    expect(out.candidates[0]!.checking).toBeUndefined();
    expect(takeWantedPairs(d).filter((w) => w.tests.some((t) => t.alone))).toEqual([]);
  });
});
