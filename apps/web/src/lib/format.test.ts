import { describe, expect, it } from 'vitest';
import { age, bandText, boardStateText, meterText, readingText } from './format';

describe('display formatting', () => {
  it('writes meter values the way a technician reads them', () => {
    expect(meterText(2200, 'ohm')).toBe('2.2 kΩ');
    expect(meterText(14.93, 'V')).toBe('14.9 V');
    expect(meterText(0.612, 'V')).toBe('612 mV');
    expect(meterText(1_500_000, 'ohm')).toBe('1.5 MΩ');
    expect(meterText('OL', 'ohm')).toBe('OL');
    expect(meterText(null, 'V')).toBe('—');
  });
  it('writes ages in minutes, hours, then days', () => {
    const now = Date.parse('2026-01-03T12:00:00Z');
    expect(age('2026-01-03T11:30:00Z', now)).toBe('30 min');
    expect(age('2026-01-03T02:00:00Z', now)).toBe('10 h');
    expect(age('2025-12-30T12:00:00Z', now)).toBe('4 d');
  });
  it('shows continuity as beep / no beep and the board state with the parts lifted', () => {
    expect(readingText({ mode: 'continuity', value: 0, unit: 'ohm', beep: true })).toBe('beep');
    expect(readingText({ mode: 'continuity', value: 'OL', unit: 'ohm', beep: null })).toBe('no beep');
    expect(readingText({ mode: 'ohm', value: 1300, unit: 'ohm' })).toBe('1.3 kΩ');
    expect(boardStateText({ power: 'off', lifted: ['C10'] })).toBe('unplugged, C10 lifted');
    expect(bandText({ expected: false, low: null, high: null, unit: 'ohm' }, 'continuity')).toBe('no beep');
  });
});
