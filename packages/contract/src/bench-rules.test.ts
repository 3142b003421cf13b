import { describe, expect, it } from 'vitest';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import { boardWords, modeWords } from './board-words';
import { guidedOrderBinds, canLiftGuidedOrder, traineeLiftRefusal } from './policy';
import { createReadingRequest } from './readings';
import { dischargeGateRefusal, judgeBusVolts, needsDischargeGate } from './safety-gate';
import { strikeReadingRequest } from './readings';
import { unprovenRows, verificationChecklist } from './verification';
import type { ExpectedReadingRow } from './boards';

// The demo board's gate model: the DC bus section touches the bus, the 15 V regulator does not.
const model = { testPoints: OUTDOOR_FAN_BOARD.testPoints, sections: OUTDOOR_FAN_BOARD.sections };
const SELV = { volts: 60, standard: 'IEC 60950-1' };

describe('the discharge gate', () => {
  it('judges the magnitude, so a reversed −120 V bus is refused in words and a reversed −2 V passes', () => {
    const r = judgeBusVolts(-120, 60);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(/^Probes reversed\? The bus reads −120 V/);
    expect(!r.ok && r.message).toMatch(/discharge the bus .* and measure again/i);
    expect(judgeBusVolts(-2, 60)).toEqual({ ok: true, magnitude: 2 });
    expect(judgeBusVolts(59.9, 60).ok).toBe(true);
    expect(judgeBusVolts(60, 60).ok).toBe(false);
  });
  it('refuses what it does not understand', () => {
    for (const v of [Number.NaN, Infinity, '3', undefined]) expect(judgeBusVolts(v, 60).ok).toBe(false);
  });
  it('gates every unpowered reading on a bus net and no powered one', () => {
    expect(needsDischargeGate(model, { power: 'off', red: 'TP1', black: '0' })).toBe(true);
    expect(needsDischargeGate(model, { power: 'on', red: 'TP1', black: '0' })).toBe(false);
    expect(needsDischargeGate(null, { power: 'off', red: 'TP3', black: '0' })).toBe(true);
    expect(dischargeGateRefusal(model, { power: 'off', red: 'TP1', black: '0' }, SELV)).toMatch(/confirm the board is unplugged/);
    expect(dischargeGateRefusal(model, { power: 'off', red: 'TP1', black: '0', safetyCheck: { unplugged: true, busVolts: -120 } }, SELV)).toMatch(
      /Probes reversed/,
    );
    expect(dischargeGateRefusal(model, { power: 'off', red: 'TP1', black: '0', safetyCheck: { unplugged: true, busVolts: 3.1 } }, SELV)).toBeNull();
  });
  it('lets a reversed reading through the schema so the gate can answer it in words', () => {
    const r = createReadingRequest.safeParse({
      idempotencyKey: 'k-12345678',
      mode: 'ohm',
      red: 'TP1',
      black: '0',
      power: 'off',
      value: 1,
      raw: '1',
      safetyCheck: { unplugged: true, busVolts: -120 },
    });
    expect(r.success).toBe(true);
  });
});

describe('guided order', () => {
  it('binds a trainee until a lead lifts it for the job or for the trainee, and nobody else', () => {
    expect(guidedOrderBinds('trainee', { job: false, trainee: false })).toBe(true);
    expect(guidedOrderBinds('trainee', { job: true, trainee: false })).toBe(false);
    expect(guidedOrderBinds('trainee', { job: false, trainee: true })).toBe(false);
    expect(guidedOrderBinds('tech', { job: false, trainee: false })).toBe(false);
    expect(canLiftGuidedOrder('lead')).toBe(true);
    expect(canLiftGuidedOrder('admin')).toBe(true);
    expect(canLiftGuidedOrder('tech')).toBe(false);
    expect(canLiftGuidedOrder('trainee')).toBe(false);
  });
  it('is lifted across all jobs for trainees only', () => {
    expect(traineeLiftRefusal('trainee')).toBeNull();
    expect(traineeLiftRefusal('tech')).toMatch(/trainees only/);
  });
});

describe('board words', () => {
  const w = boardWords(OUTDOOR_FAN_BOARD);
  it('names parts by their printed designators and faults in words', () => {
    expect(w.designator('XU1')).toBe('U1');
    expect(w.fault('XU1', 'dl:open')).toBe('U1 opto — LED open');
    expect(w.fault('Q1', 'be-open')).toMatch(/^Q1 .*— base–emitter open$/);
    expect(modeWords('q1:be-open', 'bjt')).toBe('transistor base–emitter open');
    expect(modeWords('short')).toBe('shorted');
  });
  it('names probe positions by test point, connector pin or part pin, never by net name', () => {
    expect(w.probe('TP3')).toBe('TP3 15 V rail');
    expect(w.probe('v15')).toBe('TP3 15 V rail');
    expect(w.probe('fgk')).toBe('CN3 pin 3');
    expect(w.probe('0')).toMatch(/^bus negative/);
    expect(w.probe('bl')).toBe('R1 pin 2');
    expect(w.probe('aux')).toBe('D1 anode');
    expect(w.designator('XVREG')).toBe('VREG');
    for (const n of OUTDOOR_FAN_BOARD.nets) expect(w.probe(n.name)).not.toBe(n.name);
  });
});

describe('validation messages for people', () => {
  it('words a missing reason without zod jargon', () => {
    const r = strikeReadingRequest.safeParse({ reason: '' });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.message).toBe('say why the reading is struck out (at least a few words)');
    const missing = createReadingRequest.safeParse({});
    expect(missing.error!.issues.map((i) => i.message).join(' ')).not.toMatch(/expected|Too small|>=/);
  });
});

describe('the verification checklist', () => {
  const row = (id: string, red: string, mode: 'dcv' | 'ohm', power: 'on' | 'off', lifted: string[] = []) =>
    ({ id, red, black: '0', mode, power, lifted, expected: 1, low: 0.9, high: 1.1, unit: mode === 'dcv' ? 'V' : 'ohm' }) as ExpectedReadingRow;
  const table = [
    row('a', 'TP5', 'dcv', 'on'),
    row('b', 'TP5', 'ohm', 'off'),
    row('c', 'TP5', 'ohm', 'off', ['C10']),
    row('d', 'TP1', 'dcv', 'on'),
    row('e', 'TP11', 'dcv', 'on'),
  ];
  it('takes the repaired section’s points and the rails with a sourced band, and a functional check', () => {
    const c = verificationChecklist(OUTDOOR_FAN_BOARD, table, 'C10');
    expect(c.rows.map((r) => r.id)).toEqual(['a', 'b', 'd']);
    expect(c.functionalCheck).toMatch(/CN3.*commanded speed/);
    // Proposed by the printed designator of a subcircuit part, too.
    expect(verificationChecklist(OUTDOOR_FAN_BOARD, table, 'U1').rows.map((r) => r.id)).toEqual(['a', 'b', 'd']);
  });
  it('counts a row proven only by its newest healthy reading', () => {
    const read = (verdict: string) => ({ mode: 'dcv', red: 'TP5', black: '0', redNet: 'vfan', blackNet: '0', power: 'on', lifted: [], verdict: { verdict } });
    const netOf = (p: string) => OUTDOOR_FAN_BOARD.testPoints.find((t) => t.id === p)?.net ?? p;
    expect(unprovenRows([table[0]!], [read('low'), read('ok')], netOf)).toEqual([]);
    expect(unprovenRows([table[0]!], [read('ok'), read('low')], netOf)).toHaveLength(1);
  });
});
