import { z } from 'zod';
import { idSchema, isoDateTime } from './common';
import { expectedValueSchema, meterModeSchema, powerStateSchema, readingUnitSchema, verdictSchema } from './readings';

const faultRef = z.object({ part: z.string(), mode: z.string() });

/** A reading as the engine saw it, with what the healthy board model predicts for it. */
export const diagnosisReadingSchema = z.looseObject({
  readingId: idSchema.optional(),
  mode: meterModeSchema,
  red: z.string(),
  black: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()).default([]),
  value: z.union([z.number(), z.literal('OL')]),
  expected: expectedValueSchema.nullable(),
  low: z.number().nullable(),
  high: z.number().nullable(),
  unit: readingUnitSchema.optional(),
  verdict: verdictSchema.nullable(),
});

export const diagnosisCandidateSchema = z.looseObject({
  faults: z.array(faultRef),
  probability: z.number(),
  consistent: z.boolean().optional(),
});

export const diagnosisPartSchema = z.looseObject({ part: z.string(), mode: z.string(), probability: z.number() });

/** A proposed next measurement and how much it is expected to tell. */
export const nextTestSchema = z.looseObject({
  mode: meterModeSchema,
  red: z.string(),
  black: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()).default([]),
});

/** The output of `circuit diagnose` for a job's current readings, plus where it came from. */
export const diagnosisResponse = z.looseObject({
  jobId: idSchema,
  boardVersionId: idSchema,
  engineVersion: z.string(),
  readings: z.array(diagnosisReadingSchema),
  candidates: z.array(diagnosisCandidateSchema),
  parts: z.array(diagnosisPartSchema),
  restProbability: z.number(),
  minimalDiagnoses: z.array(z.array(z.string())),
  nextTests: z.array(nextTestSchema),
});
export type Diagnosis = z.infer<typeof diagnosisResponse>;

/** Stored when a technician proposes a part for review: what the engine said at that moment. */
export const diagnosisSnapshotSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  engineVersion: z.string(),
  proposedPart: z.string().nullable(),
  createdBy: idSchema,
  createdAt: isoDateTime,
  output: diagnosisResponse,
});
export type DiagnosisSnapshot = z.infer<typeof diagnosisSnapshotSchema>;
export const diagnosisSnapshotListResponse = z.object({ items: z.array(diagnosisSnapshotSchema) });
