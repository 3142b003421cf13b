import { z } from 'zod';
import { idSchema, isoDateTime } from './common';
import { expectedValueSchema, meterModeSchema, powerStateSchema, readingUnitSchema, verdictSchema } from './readings';

const faultRef = z.object({ part: z.string(), mode: z.string() });

/** A reading as the engine saw it, with what the healthy board model predicts for it. */
export const diagnosisReadingSchema = z.object({
  readingId: idSchema,
  mode: meterModeSchema,
  red: z.string(),
  black: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()),
  /** The lifted part measured on its own pins, if this reading is of a part alone (older answers lack it). */
  alone: z.string().nullable().optional(),
  value: z.union([z.number(), z.literal('OL')]),
  expected: expectedValueSchema.nullable(),
  low: z.number().nullable(),
  high: z.number().nullable(),
  unit: readingUnitSchema,
  verdict: verdictSchema,
});

/** How one reading moves a candidate: ln L(reading | candidate) − ln L(reading | no fault). */
export const diagnosisEvidenceSchema = z.object({ reading: z.number().int(), llr: z.number(), effect: z.enum(['supports', 'against', 'neutral']) });

export const diagnosisCandidateSchema = z.object({
  faults: z.array(faultRef),
  probability: z.number(),
  evidence: z.array(diagnosisEvidenceSchema),
  /** Still being checked (a fault pair, or a test outside the board's dictionary): its place is provisional. */
  checking: z.literal(true).optional(),
});

export const diagnosisPartSchema = z.object({
  part: z.string(),
  mode: z.string(),
  probability: z.number(),
  /** The designator printed on the board ("U1" for the element XU1). */
  designator: z.string().optional(),
  /** The fault in the bench's words: "U1 opto — LED open". */
  label: z.string().optional(),
});

/** A proposed next measurement, how much it is expected to tell and what it costs at the bench. */
export const nextTestSchema = z.object({
  mode: meterModeSchema,
  red: z.string(),
  black: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()),
  /** Expected entropy (bits) of the candidate posterior after the test. */
  expectedEntropy: z.number(),
  cost: z.number(),
  /** The sentence the bench screen shows ("Unplug, discharge the bus, then ..."). */
  instruction: z.string(),
  /** Where the probes go in the bench's words: a test point, a connector pin or the nearest part pin. */
  redLabel: z.string().optional(),
  blackLabel: z.string().optional(),
  /** The lifted parts by their designators. */
  liftedLabels: z.array(z.string()).optional(),
});

/**
 * A fault-mode prior this job moved before weighing any reading, and what moved it: the unit's fault code, the
 * shop's verified history of the board model (or of the part kind on its other models), readings that agree with
 * known-good boards. `before` is the board model's prior, `after` the one the ranking used.
 */
export const priorSourceSchema = z.enum(['fault-code', 'history', 'history-kind', 'reference']);
export type PriorSource = z.infer<typeof priorSourceSchema>;
export const priorReasonSchema = z.object({
  part: z.string(),
  mode: z.string(),
  designator: z.string(),
  /** "C10 capacitor — shorted". */
  label: z.string(),
  before: z.number(),
  after: z.number(),
  steps: z.array(
    z.object({
      source: priorSourceSchema,
      note: z.string().optional(),
      factor: z.number().optional(),
      prior: z.number().optional(),
      before: z.number(),
      after: z.number(),
    }),
  ),
});
export type PriorReason = z.infer<typeof priorReasonSchema>;
const priorNoteSchema = z.object({ source: priorSourceSchema, text: z.string(), parts: z.array(z.string()) });

/** The output of `pnpm diagnose` for a job's current readings, plus where it came from. */
export const diagnosisResponse = z.object({
  jobId: idSchema,
  boardVersionId: idSchema,
  engineVersion: z.string(),
  readings: z.array(diagnosisReadingSchema),
  candidates: z.array(diagnosisCandidateSchema),
  parts: z.array(diagnosisPartSchema),
  restProbability: z.number(),
  minimalDiagnoses: z.array(z.array(z.string())),
  nextTests: z.array(nextTestSchema),
  /** Entropy (bits) of the candidate posterior. */
  entropy: z.number(),
  /** Priors this job moved, with their reasons (largest move first); empty when none moved. */
  priors: z.array(priorReasonSchema).default([]),
  /**
   * Why they moved, one line per reason in the engine's words, this job's own evidence first; a reason moving many
   * parts names the few it moves most and counts the rest ("R12, R7, R3 and 27 other resistors").
   */
  priorNotes: z.array(priorNoteSchema).default([]),
  /** The board's expected values for every fault are still being computed: parts done of the total. */
  preparing: z.object({ partsDone: z.number().int(), partsTotal: z.number().int() }).optional(),
  /** Candidates still being checked (mostly fault pairs the readings call for); the ranking updates when they arrive. */
  checking: z.object({ candidates: z.number().int() }).optional(),
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
  /** What of the stored output could not be read back (numbers a past engine wrote out of range), and was left out. */
  unreadable: z.array(z.string()).optional(),
});
export type DiagnosisSnapshot = z.infer<typeof diagnosisSnapshotSchema>;

/**
 * A stored diagnosis as it can be read back, whatever numbers it holds. A snapshot is history and is never
 * rewritten; one written from a reading like 1e308 holds nulls where the engine had Infinity or NaN (JSON has
 * neither). Each list keeps the entries that read; a number that does not read is 0 with its name listed, so
 * the page shows the rest and says what is missing instead of failing.
 */
export function readableDiagnosis(stored: unknown): { output: Diagnosis; unreadable: string[] } {
  const whole = diagnosisResponse.safeParse(stored);
  if (whole.success) return { output: whole.data, unreadable: [] };
  const o = (stored && typeof stored === 'object' ? stored : {}) as Record<string, unknown>;
  const unreadable: string[] = [];
  const list = <T>(key: string, schema: z.ZodType<T>): T[] => {
    const items = Array.isArray(o[key]) ? (o[key] as unknown[]) : [];
    const kept = items.flatMap((x) => {
      const r = schema.safeParse(x);
      return r.success ? [r.data] : [];
    });
    if (kept.length < items.length) unreadable.push(`${items.length - kept.length} of ${items.length} ${key}`);
    return kept;
  };
  const one = <T>(key: string, schema: z.ZodType<T>, fallback: T): T => {
    const r = schema.safeParse(o[key]);
    if (!r.success) unreadable.push(key);
    return r.success ? r.data : fallback;
  };
  const output: Diagnosis = {
    jobId: one('jobId', idSchema, 'unknown'),
    boardVersionId: one('boardVersionId', idSchema, 'unknown'),
    engineVersion: one('engineVersion', z.string(), 'unknown'),
    readings: list('readings', diagnosisReadingSchema),
    candidates: list('candidates', diagnosisCandidateSchema),
    parts: list('parts', diagnosisPartSchema),
    restProbability: one('restProbability', z.number(), 0),
    minimalDiagnoses: list('minimalDiagnoses', z.array(z.string())),
    nextTests: list('nextTests', nextTestSchema),
    entropy: one('entropy', z.number(), 0),
    priors: list('priors', priorReasonSchema),
    priorNotes: list('priorNotes', priorNoteSchema),
  };
  return { output, unreadable };
}
export const diagnosisSnapshotListResponse = z.object({ items: z.array(diagnosisSnapshotSchema) });
