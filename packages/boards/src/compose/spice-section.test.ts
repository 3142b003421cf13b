import { describe, expect, it } from 'vitest';
import { formatSi } from '../references/decode-marking';
import { spiceParts, spiceValue } from './spice-section';

describe('SPICE sections', () => {
  it('reads SPICE3 scale suffixes (Berkeley SPICE3 user guide, "Numeric values"): meg is mega, m is milli', () => {
    expect(spiceValue('2.2k')).toBe(2200);
    expect(spiceValue('10meg')).toBe(10e6);
    expect(spiceValue('1m')).toBe(1e-3);
    expect(spiceValue('100n')).toBeCloseTo(1e-7, 15);
    expect(spiceValue('1.5e3')).toBe(1500);
    expect(spiceValue('QP')).toBeUndefined();
    expect(formatSi(4700, 'Ω')).toBe('4.7 kΩ');
  });

  it('reads parts from element lines, leaving sources and off-board elements out', () => {
    const { parts, elements } = spiceParts(
      '* a comment\nVCMD cmd 0 DC 5\nR6 cmd la 470\nXU1 la 0 oc 0 OPTO\nQ1 vfan b1 v15 QP\nD2 led1 0 DLED\nC8 vfan 0 10u\nRLOAD vfan 0 1.5k\nRTH1 th1 0 10k',
      ['RLOAD'],
    );
    expect(elements).toEqual(['VCMD', 'R6', 'XU1', 'Q1', 'D2', 'C8', 'RLOAD', 'RTH1']);
    expect(parts.map((p) => [p.designator, p.kind])).toEqual([
      ['R6', 'resistor'],
      ['XU1', 'opto-coupler'],
      ['Q1', 'bjt'],
      ['D2', 'led'],
      ['C8', 'electrolytic-capacitor'],
      ['RTH1', 'thermistor'],
    ]);
    expect(parts[1]!.pins.map((p) => p.net)).toEqual(['la', '0', 'oc', '0']);
    expect(parts[2]!.pins).toEqual([
      { pin: 'C', net: 'vfan' },
      { pin: 'B', net: 'b1' },
      { pin: 'E', net: 'v15' },
    ]);
    expect(parts[0]).toMatchObject({ nominal: 470, value: '470 Ω', tolerance: 0.05 });
  });
});
