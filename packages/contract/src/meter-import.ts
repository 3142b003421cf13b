import { z } from 'zod';
import { idSchema, isoDateTime } from './common';
import { meterModeSchema, powerStateSchema, readingPhaseSchema, type MeterModeName } from './readings';
import { safetyCheckSchema } from './safety-gate';

const column = z.string().trim().min(1).max(100);

/** Which CSV column holds what; the test point and the value are required, the rest optional. */
export const meterColumnMapping = z.object({
  point: column,
  value: column,
  unit: column.optional(),
  function: column.optional(),
  reference: column.optional(),
  time: column.optional(),
});
export type MeterColumnMapping = z.infer<typeof meterColumnMapping>;

export const meterProfileInput = z.object({
  name: z.string().trim().min(1).max(100),
  mapping: meterColumnMapping,
  /** The meter function where the log has no function column. */
  defaultMode: meterModeSchema.default('dcv'),
  /** Where the black probe was where the log has no reference column (a test point, or gnd). */
  defaultReference: z.string().trim().min(1).max(100).default('gnd'),
  power: powerStateSchema.default('on'),
});
export type MeterProfileInput = z.input<typeof meterProfileInput>;
export const meterProfileSchema = meterProfileInput.extend({
  id: idSchema,
  defaultMode: meterModeSchema,
  defaultReference: z.string(),
  power: powerStateSchema,
});
export type MeterProfile = z.infer<typeof meterProfileSchema>;
export const meterProfileListResponse = z.object({ items: z.array(meterProfileSchema) });

/** A meter function as logged ("DCV", "VOLT:DC", "OHM", "RES", "DIODE", "CONT") → the bench's meter function. */
export function meterFunctionOf(text: string): MeterModeName | null {
  const t = text
    .trim()
    .toLowerCase()
    .replace(/[\s_:-]+/g, '');
  if (['dcv', 'vdc', 'voltdc', 'dcvolts', 'voltage', 'v'].includes(t)) return 'dcv';
  if (['ohm', 'ohms', 'ω', 'res', 'resistance', 'fres'].includes(t)) return 'ohm';
  if (['diode', 'diod', 'dio'].includes(t)) return 'diode';
  if (['cont', 'continuity', 'beep'].includes(t)) return 'continuity';
  return null;
}

/** The import and its preview send the same body; the preview stores nothing. */
export const meterImportRequest = z.object({
  /** One key per import: sending the same import again stores nothing twice. */
  importKey: z.string().trim().min(8).max(80),
  profileId: idSchema,
  /** The meter's log as text (a few thousand rows at most). */
  csv: z.string().min(1).max(500_000),
  phase: readingPhaseSchema.default('diagnosis'),
  /** Rows whose test point the log does not name (or names wrongly), bound by hand: CSV line number → test point. */
  bindings: z.record(z.string().regex(/^\d+$/), z.string().trim().min(1).max(100)).default({}),
  /** The bus measured at the discharge gate, for unpowered rows on a section that touches the bus. */
  safetyCheck: safetyCheckSchema.optional(),
});
export type MeterImportRequest = z.input<typeof meterImportRequest>;

export const importRowSchema = z.object({
  /** The line of the CSV file (the header is line 1). */
  line: z.number().int(),
  point: z.string().nullable(),
  reference: z.string(),
  mode: meterModeSchema.nullable(),
  raw: z.string(),
  value: z.union([z.number(), z.literal('OL')]).nullable(),
  takenAt: isoDateTime.nullable(),
  /** Why this row cannot be stored, in words; null for a good row. */
  error: z.string().nullable(),
  /** After the import: the stored reading. */
  readingId: idSchema.nullable(),
});
export type ImportRow = z.infer<typeof importRowSchema>;

export const meterImportResponse = z.object({
  columns: z.array(z.string()),
  rows: z.array(importRowSchema),
  good: z.number().int(),
  bad: z.number().int(),
  /** Readings stored by this request (0 for a preview, and for an import sent again). */
  stored: z.number().int(),
});
export type MeterImportResult = z.infer<typeof meterImportResponse>;
