import { describe, expect, it } from 'vitest';
import { formValuesOf, linesFormSchema } from './lines-form';

const line = { kind: 'part' as const, description: 'Opto-coupler', quantity: '2', unitPrice: '4.50', taxable: true };

describe('quote and invoice form', () => {
  it('turns typed prices into integer cents without a float', () => {
    const out = linesFormSchema.parse({
      lines: [line, { ...line, kind: 'labour', quantity: '1.5', unitPrice: '0.29', taxable: false }],
      taxRate: '8.25',
      note: '',
    });
    expect(out.lines.map((l) => l.unitCents)).toEqual([450, 29]);
    expect(out.lines[1]).toMatchObject({ kind: 'labour', quantity: '1.5', taxable: false });
    expect(out.taxRate).toBe('8.25');
  });

  it('refuses prices, quantities and rates the API would refuse', () => {
    const bad = (patch: Partial<typeof line>) => linesFormSchema.safeParse({ lines: [{ ...line, ...patch }], taxRate: '8.25', note: '' }).success;
    expect(bad({ unitPrice: '4.505' })).toBe(false);
    expect(bad({ unitPrice: '-1' })).toBe(false);
    expect(bad({ unitPrice: '1,50' })).toBe(false);
    expect(bad({ quantity: '0' })).toBe(false);
    expect(bad({ description: '  ' })).toBe(false);
    expect(linesFormSchema.safeParse({ lines: [line], taxRate: '8.2501', note: '' }).success).toBe(false);
    expect(linesFormSchema.safeParse({ lines: [], taxRate: '8', note: '' }).success).toBe(false);
  });

  it('loads a draft back as the text a person typed', () => {
    const v = formValuesOf(
      {
        taxRate: '8.875',
        note: null,
        lines: [{ id: 'l1', kind: 'part', description: 'Fuse', quantityHundredths: 100, quantity: '1', unitCents: 1205, amountCents: 1205, taxable: true }],
      },
      '0',
    );
    expect(v).toEqual({ taxRate: '8.875', note: '', lines: [{ kind: 'part', description: 'Fuse', quantity: '1', unitPrice: '12.05', taxable: true }] });
    expect(formValuesOf(null, '7').lines).toHaveLength(1);
  });
});
