// Smoke test of the accuracy bench's harness (packages/diagnosis/bench/accuracy): fault injection, the meter
// model's ground truth from ngspice against hand calculations, and one scripted-technician run end to end.
// It checks the harness, not the engine's accuracy (that is what `pnpm bench:accuracy` reports).
import { describe, expect, it } from 'vitest';
import { B01_BUS } from '../bench/accuracy/boards-power';
import { B07_THERMISTOR, B08_RELAY } from '../bench/accuracy/boards-signal';
import { CASES } from '../bench/accuracy/cases';
import { at, injectFaults, boardState } from '../bench/accuracy/deck';
import { METER, Noise, readMeter } from '../bench/accuracy/meter';
import { ngspiceAvailable } from '../bench/accuracy/ngspice';
import { MAX_ROUNDS, runCase } from '../bench/accuracy/technician';

describe('accuracy bench: deck edits', () => {
  it('cuts a BJT emitter for B–E open, opens the LED of one opto instance only, unplugs the supplies', () => {
    const board = CASES.find((c) => c.id === 'B04-ce-short+led-open')!.board;
    const net = injectFaults(board.netlist({ FANON: 1 }), [
      { part: 'Q401', injection: { do: 'be-open' } },
      { part: 'XU401', injection: { do: 'inner', element: 'DLED', inner: { do: 'open' } } },
    ]);
    expect(net).toMatch(/^Q401 vf b4 q401_eopen QSW$/m);
    expect(net).toMatch(/^XU401 la gc oc 0 OPTOC_FXU401$/m);
    const copy = net.slice(net.indexOf('.subckt OPTOC_FXU401'));
    expect(copy.slice(0, copy.indexOf('.ends'))).not.toMatch(/^DLED/m);
    const off = boardState(net, { power: 'off' });
    expect(off).not.toMatch(/^V15 /m);
    expect(off).not.toMatch(/^VCC /m);
    expect(off).not.toMatch(/^VPIN /m);
    expect(off).toMatch(/^R401 /m);
    // A shorted part lifted from the board takes its short with it.
    const shorted = injectFaults(board.netlist({ FANON: 1 }), [
      { part: 'C401', injection: { do: 'short', ohms: 0.2 } },
      { part: 'Q401', injection: { do: 'ce-short', ohms: 1 } },
    ]);
    expect(shorted).toMatch(/^RFLT_C401 vf 0 0.2$/m);
    const lifted = boardState(shorted, { power: 'off', lifted: ['C401', 'Q401'] });
    expect(lifted).not.toMatch(/C401|Q401/);
    // A controller pin held at 0 V stays as the short it is.
    expect(boardState(board.netlist({ FANON: 0 }), { power: 'off' })).toMatch(/^VPIN pin gc DC 0$/m);
  });
});

describe.skipIf(!ngspiceAvailable())('accuracy bench: ground truth through the meter model (ngspice)', () => {
  it('DC V across a divider includes the meter’s 10 MΩ (hand calculation: 5 V · (10k ∥ 10M) / (10k + 10k ∥ 10M))', async () => {
    const r = await readMeter(B07_THERMISTOR, {}, [], { mode: 'dcv', red: 'th', black: '0', power: 'on' }, new Noise('t'));
    const rp = 1 / (1 / 10e3 + 1 / 10e6);
    expect(r.ideal as number).toBeCloseTo((5 * rp) / (10e3 + rp), 3);
    // Shown value within the meter's ±(0.5 % + 3 digits) on its 6 V range.
    expect(Math.abs((r.value as number) - (r.ideal as number))).toBeLessThanOrEqual(0.005 * 2.5 + 3e-3);
  });

  it('Ω autoranges to the first range not overloaded (hand calculation: 10k ∥ (10k + 10k + 10k) = 7.5 kΩ on 60 kΩ)', async () => {
    const r = await readMeter(B07_THERMISTOR, {}, [], { mode: 'ohm', red: 'ref', black: '0', power: 'off' }, new Noise('t'));
    expect(r.range).toBe(2);
    expect(r.ideal as number).toBeCloseTo(7500, -1);
    expect(Math.abs((r.value as number) - 7500)).toBeLessThanOrEqual(0.009 * 7500 + 5 * at(METER.ohm, 2).resolution);
  });

  it('continuity beeps across a shorted bridge diode; diode test of a healthy one reads a junction', async () => {
    const shorted = [{ part: 'D104', injection: { do: 'short' as const, ohms: 0.5 } }];
    const beep = await readMeter(B01_BUS, {}, shorted, { mode: 'continuity', red: 'n', black: '0', power: 'off' }, new Noise('t'));
    expect(beep.value).toBe(true);
    const junction = await readMeter(B01_BUS, {}, [], { mode: 'diode', red: '0', black: 'n', power: 'off' }, new Noise('t'));
    expect(junction.ideal as number).toBeGreaterThan(0.3);
    expect(junction.ideal as number).toBeLessThan(0.8);
    // Reverse through the relay transistor's collector–base junction and the flyback diode: nothing conducts, OL.
    const reverse = await readMeter(B08_RELAY, { RLY: 1 }, [], { mode: 'diode', red: 'v12', black: 'pin', power: 'off' }, new Noise('t'));
    expect(reverse.value).toBe('OL');
  });

  it('runs one case end to end: start reading from ngspice, engine rounds, a result row', async () => {
    const c = CASES.find((x) => x.id === 'B07-sensor-open')!;
    const a = await runCase(c, 'smoke');
    expect(a.groundTruthError).toBeUndefined();
    // Thermistor open: the meter sees 5 V · 10M / (10M + 10k).
    expect(a.readings[0]?.ideal as number).toBeCloseTo((5 * 10e6) / (10e6 + 10e3), 3);
    expect(a.readings.length).toBe(c.start.length + a.rounds);
    expect(a.rounds).toBeLessThanOrEqual(MAX_ROUNDS);
    expect(['confident', 'no test', 'rounds', 'error']).toContain(a.end);
    // Same seed, same readings: the bench is reproducible.
    const b = await runCase(c, 'smoke');
    expect(b.readings.map((r) => r.value)).toEqual(a.readings.map((r) => r.value));
  }, 30_000);
});
