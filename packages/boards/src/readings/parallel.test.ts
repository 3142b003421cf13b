import { describe, expect, it } from 'vitest';
import { ohmsText, pairKey, parallelNote, parallelOf, shortOhms } from './parallel';

describe('parallel resistors', () => {
  it('12 kΩ ∥ 6.8 kΩ = 4.340 kΩ (REFERENCES: computed; ngspice agrees)', () => {
    expect(parallelOf([12e3, 6.8e3])).toBeCloseTo(4340.4, 1);
  });

  it('formats values as on a schematic and as a reading', () => {
    expect([shortOhms(12e3), shortOhms(6.8e3), shortOhms(470), shortOhms(2.2e6)]).toEqual(['12k', '6.8k', '470', '2.2M']);
    expect(ohmsText(4340.4)).toBe('4.34 kΩ');
  });

  it('a pair across the probes gets the parallel note; other paths that pull it further are named', () => {
    const by = new Map([
      [
        pairKey('vsp', '0'),
        [
          { name: 'R405', ohms: 12e3 },
          { name: 'R406', ohms: 6.8e3 },
        ],
      ],
    ]);
    expect(parallelNote(by, '0', 'vsp', 4340)).toBe(
      'reads 12k ∥ 6.8k ≈ 4.34 kΩ in circuit: parallel path through R405 and R406. Lift one end to read a single part.',
    );
    expect(parallelNote(by, 'vsp', '0', 2000)).toMatch(/the rest of the board pulls it to 2 kΩ/);
  });

  it('one resistor: a note only when the board pulls the reading more than 10 % away', () => {
    const by = new Map([[pairKey('a', 'b'), [{ name: 'R1', ohms: 10e3 }]]]);
    expect(parallelNote(by, 'a', 'b', 9800)).toBeUndefined();
    expect(parallelNote(by, 'a', 'b', 5000)).toBe(
      'R1 is 10k but reads 5 kΩ in circuit: parallel paths through the rest of the board. Lift one end to read R1 alone.',
    );
    expect(parallelNote(by, 'a', 'c', 5000)).toBeUndefined();
  });
});
