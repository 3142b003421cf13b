import { describe, expect, it } from 'vitest';
import { binPartFits, looksLikePartNumber, needsReorder, warrantyReturn } from './shop-memory';

describe('warrantyReturn', () => {
  const left = '2026-09-01T10:00:00.000Z';
  it('counts whole days since the board left; the last warranty day is still inside', () => {
    expect(warrantyReturn([{ number: 1001, closedAt: left }], '2026-11-30T09:00:00.000Z', 90)).toMatchObject({ jobNumber: 1001, daysSince: 89 });
    expect(warrantyReturn([{ number: 1001, closedAt: left }], '2026-11-30T10:00:00.000Z', 90)).toMatchObject({ daysSince: 90 });
    expect(warrantyReturn([{ number: 1001, closedAt: left }], '2026-12-01T10:00:00.000Z', 90)).toBeNull();
  });
  it('takes the latest visit that had left before this one, and ignores a board still in the shop', () => {
    const visits = [
      { number: 1001, closedAt: '2026-01-01T00:00:00.000Z' },
      { number: 1002, closedAt: '2026-11-01T00:00:00.000Z' },
      { number: 1003, closedAt: null },
    ];
    expect(warrantyReturn(visits, '2026-11-11T00:00:00.000Z', 30)).toMatchObject({ jobNumber: 1002, daysSince: 10 });
    expect(warrantyReturn([{ number: 1003, closedAt: null }], '2026-11-11T00:00:00.000Z', 30)).toBeNull();
  });
});

describe('binPartFits', () => {
  const r2 = { designator: 'R2', value: '4k7', nominal: 4700, package: '0805' };
  it('takes the same value written another way and the same package', () => {
    expect(binPartFits(r2, { value: '4.7k', nominal: 4700, package: '0805' })).toEqual({ ok: true });
  });
  it('refuses another value, another package and a drawer whose value is no value', () => {
    expect(binPartFits(r2, { value: '47k', nominal: 47000, package: '0805' })).toEqual({ ok: false, reason: 'R2 is 4k7; this drawer holds 47k' });
    expect(binPartFits(r2, { value: '4k7', nominal: 4700, package: '1206' })).toEqual({ ok: false, reason: 'R2 is 0805; this drawer holds 1206' });
    expect(binPartFits(r2, { value: 'banana', nominal: null, package: '0805' })).toEqual({ ok: false, reason: 'R2 is 4k7; "banana" is not a value' });
  });
  it('compares part numbers as printed, case and spacing aside', () => {
    const d1 = { designator: 'D1', value: '1N4148', nominal: null, package: 'SOD-123' };
    expect(binPartFits(d1, { value: '1n4148', nominal: null, package: 'SOD123' })).toEqual({ ok: true });
    expect(looksLikePartNumber('1N4148')).toBe(true);
    expect(looksLikePartNumber('banana')).toBe(false);
  });
  it('puts a drawer under its minimum on the reorder list', () => {
    expect(needsReorder({ quantity: 2, minimum: 3 })).toBe(true);
    expect(needsReorder({ quantity: 3, minimum: 3 })).toBe(false);
  });
});
