// Money arithmetic of quotes and invoices: integer cents, round half away from zero, tax once per document.
// Expected values are worked by hand (long multiplication), not computed with floats.
import { describe, expect, it } from 'vitest';
import {
  computeTotals,
  divRoundHalfAwayFromZero,
  formatMoney,
  formatQuantity,
  formatTaxRate,
  lineAmountCents,
  parseMoney,
  centsToDecimal,
  parseQuantity,
  parseTaxRate,
  taxCents,
} from '@splitscope/contract';

describe('round half away from zero', () => {
  it.each([
    [5n, 2n, 3n], // 2.5 → 3 (half-even would give 2)
    [7n, 2n, 4n], // 3.5 → 4
    [-5n, 2n, -3n], // -2.5 → -3
    [149n, 100n, 1n],
    [150n, 100n, 2n],
    [250n, 100n, 3n], // 2.5 → 3 (half-even would give 2)
    [-149n, 100n, -1n],
    [0n, 7n, 0n],
  ])('%i / %i = %i', (n, d, q) => {
    expect(divRoundHalfAwayFromZero(n, d)).toBe(q);
  });

  it('refuses a zero divisor', () => {
    expect(() => divRoundHalfAwayFromZero(1n, 0n)).toThrow(RangeError);
  });
});

describe('tax on a taxable subtotal', () => {
  it.each([
    // subtotal cents, rate (thousandths of a percent), tax cents, worked as subtotal × rate / 100000
    [1000, 8250, 83], // 10.00 × 8.25 % = 0.825 → 0.83 (exact half: up)
    [1000, 8240, 82], // 0.824 → 0.82
    [1000, 8260, 83], // 0.826 → 0.83
    [2000, 8250, 165], // 1.65 exactly
    [1, 50000, 1], // 0.005 → 0.01 (half a cent goes up)
    [1, 49999, 0], // 0.0049999 → 0.00
    [12345, 8875, 1096], // 123.45 × 8.875 % = 10.9561875 → 10.96
    [3333, 20000, 667], // 6.666 → 6.67
    [9999, 0, 0],
    [0, 20000, 0],
    [250_000, 7000, 17500],
    [99_999_999, 100_000, 99_999_999], // 100 %: the tax equals the subtotal
  ])('%i cents at %i m%% → %i cents', (subtotal, rate, tax) => {
    expect(taxCents(subtotal, rate)).toBe(tax);
  });

  it('refuses fractional cents and rates', () => {
    expect(() => taxCents(10.5, 8250)).toThrow(RangeError);
    expect(() => taxCents(1000, 8.25)).toThrow(RangeError);
  });
});

describe('line amounts', () => {
  it.each([
    [100, 1999, 1999], // 1 × 19.99
    [250, 1999, 4998], // 2.5 × 19.99 = 49.975 → 49.98
    [150, 6500, 9750], // 1.5 h × 65.00
    [33, 1, 0], // 0.33 × 0.01 = 0.0033 → 0.00
    [50, 1, 1], // 0.5 × 0.01 = 0.005 → 0.01
    [125, 333, 416], // 1.25 × 3.33 = 4.1625 → 4.16
  ])('%i hundredths × %i cents = %i cents', (q, unit, amount) => {
    expect(lineAmountCents(q, unit)).toBe(amount);
  });
});

describe('document totals', () => {
  it('rounds tax once on the taxable subtotal, not per line', () => {
    // three lines of 0.05 at 10 %: per-line tax would be 3 × round(0.005) = 0.03; per document it is round(0.015) = 0.02
    const lines = [1, 2, 3].map(() => ({ quantityHundredths: 100, unitCents: 5, taxable: true }));
    const t = computeTotals(lines, 10_000);
    expect(t).toEqual({ lines: [5, 5, 5], subtotalCents: 15, taxableCents: 15, taxCents: 2, totalCents: 17 });
  });

  it('leaves untaxed lines out of the taxable subtotal', () => {
    const t = computeTotals(
      [
        { quantityHundredths: 100, unitCents: 4250, taxable: true }, // bridge rectifier + opto, 42.50
        { quantityHundredths: 150, unitCents: 6500, taxable: false }, // 1.5 h labour, 97.50, untaxed
      ],
      8250,
    );
    // tax = 42.50 × 8.25 % = 3.50625 → 3.51
    expect(t).toEqual({ lines: [4250, 9750], subtotalCents: 14000, taxableCents: 4250, taxCents: 351, totalCents: 14351 });
  });

  it('is zero for a document with no lines', () => {
    expect(computeTotals([], 8250)).toEqual({ lines: [], subtotalCents: 0, taxableCents: 0, taxCents: 0, totalCents: 0 });
  });

  it('refuses amounts beyond the range it can carry exactly', () => {
    expect(() => computeTotals([{ quantityHundredths: 100_000_000, unitCents: 100_000_000_000, taxable: true }], 0)).toThrow(RangeError);
  });
});

describe('parsing and formatting without floats', () => {
  it('parses decimal text into integers', () => {
    expect(parseTaxRate('8.875')).toBe(8875);
    expect(parseTaxRate('8.25')).toBe(8250);
    expect(parseTaxRate('20')).toBe(20000);
    expect(parseQuantity('1.5')).toBe(150);
    expect(parseQuantity('0.05')).toBe(5);
    expect(parseMoney('12.5')).toBe(1250);
    expect(parseMoney('0.07')).toBe(7);
    // 0.1 + 0.2 style input stays exact
    expect(parseMoney('0.29')).toBe(29);
  });

  it('refuses malformed or out-of-range text', () => {
    expect(() => parseTaxRate('8.2501')).toThrow(RangeError);
    expect(() => parseTaxRate('101')).toThrow(RangeError);
    expect(() => parseQuantity('1,5')).toThrow(RangeError);
    expect(() => parseMoney('-3')).toThrow(RangeError);
    expect(() => parseMoney('1.234')).toThrow(RangeError);
  });

  it('formats integers back to text', () => {
    expect(centsToDecimal(1250)).toBe('12.50');
    expect(centsToDecimal(7)).toBe('0.07');
    expect(parseMoney(centsToDecimal(123456789))).toBe(123456789);
    expect(formatTaxRate(8875)).toBe('8.875');
    expect(formatTaxRate(8000)).toBe('8');
    expect(formatTaxRate(8250)).toBe('8.25');
    expect(formatQuantity(150)).toBe('1.5');
    expect(formatQuantity(200)).toBe('2');
    expect(formatQuantity(5)).toBe('0.05');
    expect(formatMoney(123456, 'usd')).toBe('USD 1,234.56');
    expect(formatMoney(7, 'usd')).toBe('USD 0.07');
    expect(formatMoney(-1050, 'eur')).toBe('-EUR 10.50');
  });
});
