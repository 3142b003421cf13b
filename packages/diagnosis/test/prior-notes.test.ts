/**
 * The history note in a technician's words (electrical/prior-notes.ts). A shop whose other board models lost
 * resistors to drift moves every resistor of this board: the line names the few it moves most and counts the rest
 * ("R3, R4, R1 and 27 other resistors"), not thirty designators in a row (common practice: a work sheet names the
 * likely parts and summarises the rest).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { createDiagnoser, type DiagnosisOutput } from '../src/index.js';
import { NAMED_PARTS, namedParts } from '../src/electrical/prior-notes.js';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive.js';

describe('naming the parts a reason moves', () => {
  const r = (designator: string) => ({ designator, kind: 'resistor' });
  it('lists a few in full and counts the rest by kind', () => {
    expect(namedParts([r('R1')])).toBe('R1');
    expect(namedParts([r('R1'), r('R2')])).toBe('R1 and R2');
    expect(namedParts([r('R1'), r('R2'), r('R3'), r('R4')])).toBe('R1, R2, R3 and R4');
    expect(namedParts(['R1', 'R2', 'R3', 'R4', 'R5', 'R6'].map(r))).toBe('R1, R2, R3 and 3 other resistors');
    expect(namedParts([r('R1'), r('R2'), r('R3'), r('R4'), { designator: 'C1', kind: 'capacitor' }])).toBe('R1, R2, R3 and 2 other parts');
  });
});

describe('resistor drift on the shop’s other models, on the demo fan drive', () => {
  let out: DiagnosisOutput;
  beforeAll(() => {
    const d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
    out = d.update([{ mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 15 }], {
      history: { kinds: { jobs: 40, failures: [{ key: 'resistor', mode: 'drift', count: 12 }] } },
      nextTests: 0,
    });
  }, 240_000);

  it('one line for the kind, three designators and the rest counted', () => {
    const kind = out.priorNotes.filter((n) => n.source === 'history-kind');
    expect(kind).toHaveLength(1);
    const line = kind[0]!;
    const resistors = out.priors.filter((p) => p.mode === 'drift').length;
    expect(resistors).toBeGreaterThan(20);
    expect(line.parts).toHaveLength(resistors);
    expect(line.text).toMatch(
      new RegExp(
        `^R\\w+, R\\w+, R\\w+ and ${resistors - NAMED_PARTS} other resistors: value drifted on resistors of the shop's other models: 12 of 40 verified boards \\(prior `,
      ),
    );
    // The line names no more than the first three designators.
    expect(line.text.match(/\bR[A-Z]*\d+\b/g)).toHaveLength(NAMED_PARTS);
  });
});
