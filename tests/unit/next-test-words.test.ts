// The next test's sentence names probe points as the bench finds them, through the engine's one words layer
// (words.ts probePoint), on the demo board as the server builds its engine: a test point as printed, then what
// it is ("TP5 Fan control supply (VFAN)", as the readings list reads); a net without a test point by its
// connector pin ("CN3 pin 3") or the nearest part pin ("C11 +"); the reference by the bulk capacitor's negative
// pin, where the discharge check is made.
import { describe, expect, it } from 'vitest';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import type { CaseReading } from '@splitscope/diagnosis';
import { buildBoardEngine } from '../../apps/server/src/features/boards/engine';

const engine = buildBoardEngine('next-test-words', OUTDOOR_FAN_BOARD);
// A healthy 15 V rail, a dead fan supply, and a reading on the speed-pulse net and one on the feedback filter.
const readings: CaseReading[] = [
  { mode: 'dcv', red: 'v15', black: '0', power: 'on', lifted: [], value: 14.98 },
  { mode: 'dcv', red: 'vfan', black: '0', power: 'on', lifted: [], value: 0.05 },
  { mode: 'dcv', red: 'fgk', black: '0', power: 'on', lifted: [], value: 0 },
  { mode: 'dcv', red: 'fbm', black: '0', power: 'on', lifted: [], value: 0 },
];
const out = engine.diagnoser.update(readings);

describe('next-test words on the demo board', () => {
  it('a test point is said as printed first, then what it is', () => {
    expect(out.readings[1]!.probes.red).toMatchObject({ label: 'TP5', said: 'TP5 Fan control supply (VFAN)' });
    const onTp = out.nextTests.filter((t) => /put the red probe on TP\d+/.test(t.instruction));
    expect(onTp.length).toBeGreaterThan(0);
    for (const t of onTp) expect(t.instruction).toContain(`red probe on ${t.probes.red.said} and`);
    // Every demo test point has a description, so each is said with it after its id (which tests come next
    // depends on the ranking; how a point is said does not).
    for (const t of onTp) expect(t.probes.red.said).toMatch(/^TP\d+ \S/);
  });

  it('no sentence names a point by its description alone', () => {
    for (const t of out.nextTests) expect(t.instruction).not.toMatch(/red probe on (Fan control supply|15 V rail|Switch base|Drive opto)/);
  });

  it('a connector pin and a part pin are said by themselves; the reference is the bulk capacitor minus', () => {
    expect(out.readings[2]!.probes.red).toMatchObject({ label: 'CN3 pin 3', said: 'CN3 pin 3' });
    expect(out.readings[3]!.probes.red).toMatchObject({ label: 'C11 +', said: 'C11 +' });
    expect(out.readings[0]!.probes.black.said).toBe('C1 −');
    for (const t of out.nextTests.filter((x) => x.black === '0')) expect(t.instruction).toContain('the black on C1 −');
  });
});
