import { z } from 'zod';
import { idSchema, isoDateTime, optionalText } from './common';
import { meterModeSchema, powerStateSchema, readingUnitSchema } from './readings';

/**
 * Known-good references: readings of a board that works (recorded on purpose, or a repaired board's verification
 * readings promoted), kept per board model. Each set is one board. Expected bands are shown from three sources,
 * each labelled: computed from the model, measured on known-good boards, and a published band (a datasheet or
 * standard the board model's test point cites).
 */
const reading = z.object({
  mode: meterModeSchema,
  red: z.string().trim().min(1, { error: 'Name the red probe point' }).max(64),
  black: z.string().trim().min(1, { error: 'Name the black probe point' }).max(64),
  power: powerStateSchema,
  /** Volts or ohms; 'OL' for an open reading. Continuity is not kept as a reference (a beep has no band). */
  value: z.union([z.number({ error: 'The value must be a number or OL' }).finite(), z.literal('OL')]),
});

export const createReferenceSetRequest = z.object({
  /** The good board's serial, so the same board is not counted twice. */
  serial: optionalText(100),
  note: optionalText(1000),
  readings: z.array(reading).min(1, { error: 'Record at least one reading of the good board' }).max(500),
});
export type CreateReferenceSetRequest = z.input<typeof createReferenceSetRequest>;

export const promoteReferenceRequest = z.object({ note: optionalText(1000) });

export const referenceSetSchema = z.object({
  id: idSchema,
  boardId: idSchema,
  boardVersion: z.number().int(),
  jobId: idSchema.nullable(),
  jobNumber: z.number().int().nullable(),
  serial: z.string().nullable(),
  note: z.string().nullable(),
  /** Recorded on a known-good board, or a repaired board's verification readings. */
  origin: z.enum(['recorded', 'verification']),
  readings: z.number().int(),
  createdByName: z.string(),
  createdAt: isoDateTime,
});
export type ReferenceSet = z.infer<typeof referenceSetSchema>;

const band = z.object({ low: z.number(), high: z.number() });
export const referenceBandSchema = z.object({
  mode: meterModeSchema,
  power: powerStateSchema,
  red: z.string(),
  black: z.string(),
  /** The probe positions in words ("TP3 15 V rail"). */
  label: z.string(),
  unit: readingUnitSchema,
  model: band.extend({ expected: z.union([z.number(), z.literal('OL'), z.boolean()]) }).nullable(),
  measured: band.extend({ median: z.number(), spread: z.number(), boards: z.number().int() }).nullable(),
  published: band.extend({ source: z.string() }).nullable(),
  /** Why the point needs a look in the board editor; null when the sources agree. */
  review: z.string().nullable(),
});
export type ReferenceBand = z.infer<typeof referenceBandSchema>;

export const boardReferencesResponse = z.object({ sets: z.array(referenceSetSchema), bands: z.array(referenceBandSchema) });
export type BoardReferences = z.infer<typeof boardReferencesResponse>;

/** A point's readings on the known-good boards, one value per board (its median when measured more than once). */
export interface MeasuredPoint {
  mode: z.infer<typeof meterModeSchema>;
  power: z.infer<typeof powerStateSchema>;
  red: string;
  black: string;
  values: number[];
}

const median = (xs: readonly number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
};

/**
 * Median and spread of the good boards, and the band they give. Spread: 1.4826 × the median absolute deviation,
 * the robust estimate of a normal standard deviation (Rousseeuw & Croux 1993, "Alternatives to the median
 * absolute deviation", JASA 88; from memory), so one odd board does not widen it. Band: median ± the largest of
 * 3 spreads, 2 % of the median and the meter's last digits (0.05 V, 1 Ω) — a band from two boards that read the
 * same is not a zero-width band (common practice).
 */
export function measuredBand(mode: MeasuredPoint['mode'], values: readonly number[]) {
  const m = median(values);
  const spread = 1.4826 * median(values.map((v) => Math.abs(v - m)));
  const half = Math.max(3 * spread, 0.02 * Math.abs(m), mode === 'ohm' ? 1 : 0.05);
  return { median: m, spread, low: m - half, high: m + half, boards: values.length };
}

/**
 * When the board editor flags a point: the model's value lies outside the band the good boards give and the good
 * boards' median lies outside the model's band (they disagree by more than either band), or the model's value lies
 * outside the published band. Either way a model error is found before it misleads a diagnosis.
 */
export function referenceReview(
  unitWord: string,
  model: { expected: number | 'OL' | boolean; low: number; high: number } | null,
  measured: ReturnType<typeof measuredBand> | null,
  published: { low: number; high: number; source: string } | null,
): string | null {
  if (!model || typeof model.expected !== 'number') return null;
  const f = (x: number) => `${Number(x.toPrecision(3))} ${unitWord}`;
  if (measured && (model.expected < measured.low || model.expected > measured.high) && (measured.median < model.low || measured.median > model.high)) {
    return `The model gives ${f(model.expected)} (${f(model.low)} – ${f(model.high)}); ${measured.boards} known-good board${measured.boards === 1 ? '' : 's'} read ${f(measured.median)} (median): check the model's parts and values around this point.`;
  }
  if (published && (model.expected < published.low || model.expected > published.high)) {
    return `The model gives ${f(model.expected)}, outside the published band ${f(published.low)} – ${f(published.high)}: check the model's parts and values around this point.`;
  }
  return null;
}
