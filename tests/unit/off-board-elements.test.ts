// Only the parts of a board model's part list (designators printed on the board) are candidates. The demo outdoor
// board's netlist holds RLOAD, the load the fan motor's electronics put on CN3 (its fan-switch section lists it as
// off the board): it shapes every expected value but a technician cannot replace it, so it must never be ranked,
// named in the words or offered as a part to lift (common practice: a repair names what is on the board).
import { describe, expect, it } from 'vitest';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import { createDiagnoser, CaseError } from '@splitscope/diagnosis';
import { buildBoardEngine, offBoardElements } from '../../apps/server/src/features/boards/engine';

describe('model-only elements of a board model', () => {
  it('the outdoor demo board: RLOAD is off the board, every listed part is not', () => {
    const off = offBoardElements(OUTDOOR_FAN_BOARD);
    expect(off).toEqual(['RLOAD']);
    for (const p of OUTDOOR_FAN_BOARD.parts) if (p.element) expect(off).not.toContain(p.element);
  });

  it('a dead fan supply ranks board parts only, and no word names RLOAD', () => {
    const engine = buildBoardEngine('off-board-test', OUTDOOR_FAN_BOARD);
    expect(engine.diagnoser.model.parts.map((p) => p.name)).not.toContain('RLOAD');
    // VFAN at 0 V with the fan commanded on: a shorted load would explain it as well as a shorted C8 or D3.
    const out = engine.diagnoser.update([{ mode: 'dcv', red: 'vfan', black: '0', value: 0.02, power: 'on' }], { top: 40, nextTests: 10 });
    expect(out.candidates.length).toBeGreaterThan(3);
    expect(out.candidates[0]!.faults.length).toBeGreaterThan(0);
    const named = JSON.stringify({ candidates: out.candidates, parts: out.parts, nextTests: out.nextTests, unexplained: out.unexplained });
    expect(named).not.toMatch(/rload/i);
    // The load still shapes the healthy value: VFAN expected near the switched 15 V rail less the PNP's drop.
    expect(out.readings[0]!.expected).toBeGreaterThan(13);
  }, 120_000);

  it('an off-board name the netlist does not hold is refused', () => {
    expect(() => createDiagnoser({ netlist: 'x\nV1 a 0 5\nR1 a 0 1k\n.end', offBoard: ['RX'] })).toThrow(CaseError);
  });
});
