import { z } from 'zod';
import { lineKindSchema } from './billing';
import { idSchema, isoDateTime, optionalText } from './common';
import { jobStatusSchema } from './jobs';

// ---- Service terms: the shop's warranty days and labour rate ----

export const serviceTermsSchema = z.object({
  warrantyDays: z.number().int(),
  labourRateCents: z.number().int(),
  repairMinutes: z.number().int(),
});
export type ServiceTerms = z.infer<typeof serviceTermsSchema>;

export const updateServiceTermsRequest = z
  .object({
    warrantyDays: z.number().int().min(0).max(3650),
    labourRateCents: z.number().int().min(0).max(1_000_000),
    repairMinutes: z
      .number()
      .int()
      .min(1)
      .max(24 * 60),
  })
  .partial();
export type UpdateServiceTermsRequest = z.input<typeof updateServiceTermsRequest>;

// ---- Board history by serial ----

const DAY_MS = 24 * 60 * 60 * 1000;

export interface EarlierVisit {
  number: number;
  /** When the board left the shop (the job moved to returned); null while it is still here. */
  closedAt: string | null;
}

export const warrantyFlagSchema = z.object({
  /** The earlier job whose board came back. */
  jobNumber: z.number().int(),
  leftAt: isoDateTime,
  daysSince: z.number().int(),
  warrantyDays: z.number().int(),
});
export type WarrantyFlag = z.infer<typeof warrantyFlagSchema>;

/**
 * A warranty return: the board left the shop after an earlier job no more than the shop's warranty days before it
 * came back. The latest earlier visit counts (its repair is the one under warranty). Days are whole days since
 * the board left, rounded down; a return on day `warrantyDays` is still inside.
 */
export function warrantyReturn(earlier: readonly EarlierVisit[], receivedAt: string, warrantyDays: number): WarrantyFlag | null {
  const received = Date.parse(receivedAt);
  const left = earlier
    .filter((v): v is EarlierVisit & { closedAt: string } => v.closedAt !== null && Date.parse(v.closedAt) <= received)
    .sort((a, b) => Date.parse(b.closedAt) - Date.parse(a.closedAt))[0];
  if (!left) return null;
  const daysSince = Math.floor((received - Date.parse(left.closedAt)) / DAY_MS);
  return daysSince <= warrantyDays ? { jobNumber: left.number, leftAt: left.closedAt, daysSince, warrantyDays } : null;
}

export const serialQuery = z
  .object({ serial: z.string().trim().max(100).optional(), unitSerial: z.string().trim().max(100).optional() })
  .refine((q) => !!q.serial || !!q.unitSerial, 'give a board serial or a unit serial');
export type SerialQuery = z.input<typeof serialQuery>;

const historyRepairSchema = z.object({
  part: z.string(),
  action: z.string(),
  replacementValue: z.string().nullable(),
  marking: z.string().nullable(),
  byName: z.string(),
  at: isoDateTime,
});

const historyReadingSchema = z.object({
  /** Where the probes went and the meter function, in the bench's words: "TP2 divider to bus negative, DC V, powered". */
  where: z.string(),
  raw: z.string(),
  verdict: z.enum(['ok', 'low', 'high']).nullable(),
  phase: z.enum(['diagnosis', 'verification']),
  byName: z.string(),
  takenAt: isoDateTime,
});

export const historyJobSchema = z.object({
  id: idSchema,
  number: z.number().int(),
  status: jobStatusSchema,
  /** Which serial matched: the board's own or the unit's. */
  matchedBy: z.enum(['board serial', 'unit serial']),
  serial: z.string().nullable(),
  unitSerial: z.string().nullable(),
  boardName: z.string(),
  customerName: z.string(),
  symptom: z.string(),
  faultCode: z.string().nullable(),
  /** The part the diagnosis settled on, as printed on the board. */
  proposedPart: z.string().nullable(),
  receivedAt: isoDateTime,
  closedAt: isoDateTime.nullable(),
  repairs: z.array(historyRepairSchema),
  readings: z.array(historyReadingSchema),
});
export type HistoryJob = z.infer<typeof historyJobSchema>;

export const boardHistoryResponse = z.object({
  warrantyDays: z.number().int(),
  /** Set when the board (or unit) is back within the warranty days of its latest earlier visit. */
  warranty: warrantyFlagSchema.nullable(),
  /** Earlier jobs, newest first. */
  jobs: z.array(historyJobSchema),
});
export type BoardHistory = z.infer<typeof boardHistoryResponse>;

// ---- Parts bin ----

/** A package name compared the way the drawer labels and the board model write them: "TO-220" is "to220". */
export const samePackage = (a: string, b: string) => a.toLowerCase().replace(/[\s\-_]/g, '') === b.toLowerCase().replace(/[\s\-_]/g, '');

/**
 * A part number as printed ("1N4148", "PC817-class"): letters and digits with at least one digit. A value that
 * parses as a number is a value, not a part number; text with no digit ("banana") is neither.
 */
export const looksLikePartNumber = (s: string) => /\d/.test(s) && /^[A-Za-z0-9][A-Za-z0-9 .,+\-/()]*$/.test(s.trim());

export interface FitSide {
  value: string;
  /** The value in SI units, parsed with the reading field's parser; null for a part number. */
  nominal: number | null;
  package: string;
}

/**
 * Whether a bin part may replace a board part: the same package, and the same value — numerically within one part
 * in a million for valued parts (4k7 is 4.7k is 4700), or the same part number, case and spacing aside.
 * Substitutes (a higher rating, another package) are a lead's call and are recorded without the bin.
 */
export function binPartFits(part: FitSide & { designator: string }, bin: FitSide): { ok: true } | { ok: false; reason: string } {
  if (!samePackage(part.package, bin.package)) return { ok: false, reason: `${part.designator} is ${part.package}; this drawer holds ${bin.package}` };
  if (part.nominal !== null) {
    if (bin.nominal === null) return { ok: false, reason: `${part.designator} is ${part.value}; "${bin.value}" is not a value` };
    if (Math.abs(part.nominal - bin.nominal) > Math.abs(part.nominal) * 1e-6)
      return { ok: false, reason: `${part.designator} is ${part.value}; this drawer holds ${bin.value}` };
    return { ok: true };
  }
  const norm = (s: string) => s.toLowerCase().replace(/\s+/g, '');
  return norm(part.value) === norm(bin.value) ? { ok: true } : { ok: false, reason: `${part.designator} is ${part.value}; this drawer holds ${bin.value}` };
}

/** Under the minimum: the drawer is on the reorder list. */
export const needsReorder = (p: { quantity: number; minimum: number }) => p.quantity < p.minimum;

export const binPartInput = z.object({
  value: z.string().trim().min(1).max(64),
  package: z.string().trim().min(1).max(32),
  rating: optionalText(32),
  marking: optionalText(64),
  quantity: z.number().int().min(0).max(100_000),
  drawer: z.string().trim().min(1).max(32),
  minimum: z.number().int().min(0).max(100_000).default(0),
  unitCents: z.number().int().min(0).max(10_000_000).default(0),
});
export type BinPartInput = z.input<typeof binPartInput>;
export const updateBinPartRequest = binPartInput.partial().refine((o) => Object.keys(o).length > 0, 'nothing to change');

export const binPartSchema = z.object({
  id: idSchema,
  value: z.string(),
  nominal: z.number().nullable(),
  package: z.string(),
  rating: z.string().nullable(),
  marking: z.string().nullable(),
  quantity: z.number().int(),
  drawer: z.string(),
  minimum: z.number().int(),
  unitCents: z.number().int(),
  reorder: z.boolean(),
});
export type BinPart = z.infer<typeof binPartSchema>;
export const binPartListResponse = z.object({ items: z.array(binPartSchema) });
export type BinPartList = z.infer<typeof binPartListResponse>;

/** Quote lines pre-filled from the parts taken for the job and the shop's labour rate; the quote form edits them. */
export const quoteDraftResponse = z.object({
  lines: z.array(
    z.object({
      kind: lineKindSchema,
      description: z.string(),
      /** Decimal text as the quote form takes it: "2" parts, "1.5" hours. */
      quantity: z.string(),
      unitCents: z.number().int(),
      taxable: z.boolean(),
    }),
  ),
});
export type QuoteDraft = z.infer<typeof quoteDraftResponse>;
