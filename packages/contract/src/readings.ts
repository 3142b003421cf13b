import { z } from 'zod';
import { BOUNDS, ohmsSchema, voltsSchema } from './bounds';
import { idSchema, isoDateTime, isoDateTimeInput, optionalText } from './common';
import { safetyCheckSchema } from './safety-gate';

export const meterModes = ['dcv', 'ohm', 'diode', 'continuity'] as const;
export const meterModeSchema = z.enum(meterModes);
export type MeterModeName = z.infer<typeof meterModeSchema>;

export const powerStates = ['on', 'off'] as const;
export const powerStateSchema = z.enum(powerStates);
export type PowerState = z.infer<typeof powerStateSchema>;

/** Diagnosis readings find the fault; verification readings, taken after the repair, prove the board good. */
export const readingPhases = ['diagnosis', 'verification'] as const;
export const readingPhaseSchema = z.enum(readingPhases);
export type ReadingPhase = z.infer<typeof readingPhaseSchema>;

export const verdicts = ['ok', 'low', 'high'] as const;
export const verdictSchema = z.enum(verdicts);
export type Verdict = z.infer<typeof verdictSchema>;

/** Volts for dcv and diode, ohms for ohm and continuity. */
export const readingUnitSchema = z.enum(['V', 'ohm']);
export type ReadingUnit = z.infer<typeof readingUnitSchema>;

/**
 * A meter value in SI units, or "OL" (over range / open). Only finite numbers within what a meter can show in
 * some mode; the request narrows it to the mode's own range (volts or ohms, `BOUNDS`).
 */
export const meterValueSchema = z.union([z.literal('OL'), z.number().refine(Number.isFinite).min(BOUNDS.volts.min).max(BOUNDS.ohms.max)], {
  error: `must be a number in SI units (V from ${BOUNDS.volts.min} to ${BOUNDS.volts.max}, ohm up to ${BOUNDS.ohms.max}) or "OL"`,
});

/** The unit a meter mode reads in: volts for DC V and diode, ohms for Ω and continuity. */
export const unitOf = (mode: MeterModeName): 'V' | 'ohm' => (mode === 'dcv' || mode === 'diode' ? 'V' : 'ohm');

/** The range of the mode's unit: volts for DC V and diode, ohms for Ω and continuity. */
const valueForMode = (mode: MeterModeName) => (mode === 'dcv' || mode === 'diode' ? voltsSchema : ohmsSchema);
export type MeterValue = z.infer<typeof meterValueSchema>;

const netName = z.string().trim().min(1).max(100);

/**
 * Why a reading cannot be of a part on its own pins, in the bench's words, or null when it can: the part is off
 * the board (lifted), the board unplugged, and the meter on Ω, diode or continuity. The engine checks the pins.
 */
export function aloneRefusal(r: { alone?: string; mode: MeterModeName; power: PowerState; lifted: readonly string[] }): string | null {
  const part = r.alone?.trim();
  if (!part) return null;
  if (r.mode === 'dcv' || r.power !== 'off') return `${part} on its own pins is measured unpowered with Ω, diode or continuity, not DC V`;
  if (!r.lifted.some((p) => p.trim().toLowerCase() === part.toLowerCase()))
    return `Lift ${part} first: a part is measured on its own pins only when it is off the board`;
  return null;
}

export const createReadingRequest = z
  .object({
    /** Chosen by the client once per reading; a retried POST with the same key returns the stored reading. */
    idempotencyKey: z.string().trim().min(8).max(100),
    mode: meterModeSchema,
    /** A net name or a test point id of the pinned board model. */
    red: netName,
    black: netName,
    power: powerStateSchema,
    /** Top-level part names lifted from the board for this reading. */
    lifted: z.array(z.string().trim().min(1).max(50)).max(20).default([]),
    /**
     * A lifted part measured on its own pins ("C10 lifted, Ω across its pins"): red and black are two of its pins'
     * nets, the board is unplugged, the part is one of `lifted`. The reading is evidence about that part alone.
     */
    alone: z.string().trim().min(1).max(50).optional(),
    value: meterValueSchema,
    /** Continuity: whether the meter beeped. */
    beep: z.boolean().optional(),
    /** What the technician typed ("4.7k", "0.61 V", "OL"). */
    raw: z.string().trim().min(1).max(100),
    instrument: optionalText(100),
    phase: readingPhaseSchema.default('diagnosis'),
    /** The id of a reading this one corrects; the corrected one stays in the history, marked superseded. */
    supersedes: idSchema.optional(),
    /** When it was read at the bench, if queued offline; defaults to the time the server stored it. */
    takenAt: isoDateTimeInput.optional(),
    /** The bus-discharge gate passed before an unpowered reading on a section that touches the bus. */
    safetyCheck: safetyCheckSchema.optional(),
  })
  .superRefine((r, ctx) => {
    if (r.alone !== undefined) {
      const why = aloneRefusal(r);
      if (why) ctx.addIssue({ code: 'custom', path: ['alone'], message: why });
    }
    if (r.value === 'OL') return;
    const checked = valueForMode(r.mode).safeParse(r.value);
    if (!checked.success) ctx.addIssue({ code: 'custom', path: ['value'], message: checked.error.issues[0]!.message });
  });
export type CreateReadingRequest = z.input<typeof createReadingRequest>;
export type CreateReadingInput = z.output<typeof createReadingRequest>;

export const expectedValueSchema = z.union([z.number(), z.literal('OL'), z.boolean()]);

/** What the pinned board model says this reading should be, and how the reading compares. */
export const readingVerdictSchema = z.object({
  /** A number in SI units, "OL", or for continuity whether the meter should beep. */
  expected: expectedValueSchema,
  /** The healthy band; null where there is none (an expected OL, continuity). */
  low: z.number().nullable(),
  high: z.number().nullable(),
  unit: readingUnitSchema,
  verdict: verdictSchema,
});
export type ReadingVerdict = z.infer<typeof readingVerdictSchema>;

export const readingSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  mode: meterModeSchema,
  red: z.string(),
  black: z.string(),
  /** The nets the probes were on, after resolving test point ids through the pinned board model. */
  redNet: z.string(),
  blackNet: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()),
  /** The lifted part this reading measured on its own pins (red and black on its pins); null for a board reading. */
  alone: z.string().nullable(),
  value: z.union([z.number(), z.literal('OL')]),
  unit: readingUnitSchema,
  beep: z.boolean().nullable(),
  raw: z.string(),
  instrument: z.string().nullable(),
  phase: readingPhaseSchema,
  idempotencyKey: z.string(),
  supersedes: idSchema.nullable(),
  /** Set when a later reading corrects this one. */
  supersededBy: idSchema.nullable(),
  authorId: idSchema,
  authorName: z.string(),
  takenAt: isoDateTime,
  createdAt: isoDateTime,
  /** Null when the board model cannot predict this probe (the engine refused or did not converge). */
  verdict: readingVerdictSchema.nullable(),
  /** The bus voltage measured at the safety gate before this unpowered reading; null when no gate was asked. */
  safetyBusVolts: z.number().nullable(),
  /** Set when the reading was struck out: it stays listed, struck through, and no longer counts. */
  struck: z.object({ reason: z.string(), authorName: z.string(), at: isoDateTime }).nullable(),
});
export type StoredReading = z.infer<typeof readingSchema>;

/** POST answer: the stored reading with the verdict at top level, as the issue asks. */
export const createReadingResponse = readingSchema.extend({
  expected: expectedValueSchema.nullable(),
  low: z.number().nullable(),
  high: z.number().nullable(),
});
export type CreateReadingResponse = z.infer<typeof createReadingResponse>;

export const readingListQuery = z.object({
  /** `current` leaves out superseded rows; the default `all` is the full history. */
  view: z.enum(['all', 'current']).default('all'),
  phase: readingPhaseSchema.optional(),
});

export const readingListResponse = z.object({ items: z.array(readingSchema) });
export type ReadingList = z.infer<typeof readingListResponse>;

export const strikeReadingRequest = z.object({
  reason: z.string().trim().min(3, 'say why the reading is struck out (at least a few words)').max(500),
});
export type StrikeReadingRequest = z.input<typeof strikeReadingRequest>;
export const readingParams = z.object({ id: idSchema, readingId: idSchema });
