// The form behind the quote and invoice editors. People type prices in the shop's currency ("12.50"); the
// contract's `moneyText` turns them into integer cents and the server prices the lines. Nothing here adds
// money up: the totals on screen are the server's answer.
import {
  centsToDecimal,
  lineKindSchema,
  moneyText,
  parseQuantity,
  quantityPattern,
  taxRatePattern,
  type BillingLine,
  type CreateQuoteRequest,
} from '@splitscope/contract';
import { z } from 'zod';

const lineForm = z.object({
  kind: lineKindSchema,
  description: z.string().trim().min(1, 'Describe the line').max(300, 'At most 300 characters'),
  quantity: z
    .string()
    .trim()
    .regex(quantityPattern, 'A quantity like 1 or 1.5')
    .refine((q) => parseQuantity(q) > 0, 'More than 0'),
  unitPrice: z.string().trim().pipe(moneyText),
  taxable: z.boolean(),
});

export const linesFormSchema = z
  .object({
    lines: z.array(lineForm).min(1, 'Add at least one line').max(100, 'At most 100 lines'),
    taxRate: z.string().trim().regex(taxRatePattern, 'A rate in percent, like 8.25'),
    note: z.string().max(2000, 'At most 2,000 characters'),
  })
  .transform((v): CreateQuoteRequest => ({
    lines: v.lines.map(({ unitPrice, ...l }) => ({ ...l, unitCents: unitPrice })),
    taxRate: v.taxRate,
    note: v.note,
  }));

export type LinesFormValues = z.input<typeof linesFormSchema>;

export const blankLine = (kind: 'part' | 'labour' = 'part'): LinesFormValues['lines'][number] => ({
  kind,
  description: '',
  quantity: '1',
  unitPrice: '',
  // labour is often outside sales tax, but rules differ by place: the shop decides per line
  taxable: true,
});

/** The form's starting values: a draft's lines as typed text again, or one empty part line. */
export function formValuesOf(doc: { lines: BillingLine[]; taxRate: string; note?: string | null } | null, defaultRate: string): LinesFormValues {
  if (!doc) return { lines: [blankLine('part')], taxRate: defaultRate, note: '' };
  return {
    lines: doc.lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      quantity: l.quantity,
      unitPrice: centsToDecimal(l.unitCents),
      taxable: l.taxable,
    })),
    taxRate: doc.taxRate,
    note: doc.note ?? '',
  };
}
