import { and, asc, eq, like } from 'drizzle-orm';
import { parse as parseCsv, CsvError } from 'csv-parse/sync';
import {
  createReadingRequest,
  meterColumnMapping,
  meterFunctionOf,
  type ImportRow,
  type MeterImportResult,
  type MeterProfile,
  type MeterProfileInput,
} from '@splitscope/contract';
import { parseReadingInput } from '@splitscope/boards/units';
import type { z } from 'zod';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardModelVersions, meterProfiles, readings } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { powerRefusal } from '../boards';
import { getJobRow } from '../../db/job-row';
import { createReading } from '../readings';

type ProfileRow = typeof meterProfiles.$inferSelect;
const toProfile = (r: ProfileRow): MeterProfile => ({
  id: r.id,
  name: r.name,
  mapping: meterColumnMapping.parse(r.mapping),
  defaultMode: r.defaultMode,
  defaultReference: r.defaultReference,
  power: r.power,
});

export async function findMeterProfiles({ db, shopId }: { db: Db; shopId: string }) {
  const rows = await db.select().from(meterProfiles).where(eq(meterProfiles.shopId, shopId)).orderBy(asc(meterProfiles.name));
  return { items: rows.map(toProfile) };
}

/** Saves a meter's column mapping under its name: the same name again replaces the mapping. */
export async function saveMeterProfile({ db, shopId, input }: { db: Db; shopId: string; input: Required<MeterProfileInput> }): Promise<MeterProfile> {
  const values = {
    mapping: input.mapping,
    defaultMode: input.defaultMode,
    defaultReference: input.defaultReference,
    power: input.power,
    updatedAt: new Date(),
  };
  const [row] = await db
    .insert(meterProfiles)
    .values({ id: newId(), shopId, name: input.name, ...values })
    .onConflictDoUpdate({ target: [meterProfiles.shopId, meterProfiles.name], set: values })
    .returning();
  return toProfile(row!);
}

interface ImportBody {
  importKey: string;
  profileId: string;
  csv: string;
  phase: 'diagnosis' | 'verification';
  bindings: Record<string, string>;
  safetyCheck?: { busVolts: number } & Record<string, unknown>;
}

const GROUND = new Set(['gnd', '0']);

/**
 * The log's delimiter: the one of semicolon, tab and comma its header line uses most. A meter set to a decimal
 * comma logs with semicolons ("14,9;V"), so the comma is not taken as a delimiter when the header has another.
 */
function delimiterOf(csv: string): string {
  const header = csv.replace(/^\uFEFF/, '').split(/\r?\n/, 1)[0] ?? '';
  const count = (d: string) => header.split(d).length - 1;
  return [';', '\t', ','].reduce((best, d) => (count(d) > count(best) ? d : best), ',');
}

function readCsv(csv: string): { columns: string[]; records: { line: number; cells: Record<string, string> }[] } {
  const delimiter = delimiterOf(csv);
  try {
    const out = parseCsv(csv, { columns: true, skip_empty_lines: true, trim: true, bom: true, relax_column_count: true, delimiter, info: true }) as {
      record: Record<string, string>;
      info: { lines: number };
    }[];
    const columns = out[0] ? Object.keys(out[0].record) : (csv.split(/\r?\n/, 1)[0] ?? '').split(delimiter).map((c) => c.trim());
    return { columns, records: out.map((r) => ({ line: r.info.lines, cells: r.record })) };
  } catch (err) {
    if (err instanceof CsvError)
      throw new AppError('invalid', `The file is not a CSV table the import can read: ${err.message}`, { errors: [{ path: 'csv', message: err.message }] });
    throw err;
  }
}

/** Every row of the log as the reading it would be, or the reason it cannot be one. Stores nothing. */
async function analyse(db: Db, actor: Actor, jobId: string, body: ImportBody) {
  const job = await getJobRow(db, actor.shopId, jobId);
  const [profileRow] = await db
    .select()
    .from(meterProfiles)
    .where(and(eq(meterProfiles.id, body.profileId), eq(meterProfiles.shopId, actor.shopId)));
  if (!profileRow) throw new AppError('invalid', `No meter profile ${body.profileId}`, { errors: [{ path: 'profileId', message: 'unknown meter profile' }] });
  const profile = toProfile(profileRow);
  const [version] = await db.select({ document: boardModelVersions.document }).from(boardModelVersions).where(eq(boardModelVersions.id, job.boardVersionId));
  const points = new Map(((version?.document as { testPoints?: { id: string }[] } | undefined)?.testPoints ?? []).map((t) => [t.id.toLowerCase(), t.id]));
  const { columns, records } = readCsv(body.csv);
  const mapped = Object.entries(profile.mapping).filter((e): e is [string, string] => typeof e[1] === 'string');
  const missing = mapped.filter(([, c]) => !columns.includes(c));
  if (missing.length) {
    throw new AppError(
      'invalid',
      `The file has no column ${missing.map(([, c]) => `"${c}"`).join(', ')} of the profile "${profile.name}"; its columns are ${columns.map((c) => `"${c}"`).join(', ')}`,
      {
        errors: [{ path: 'csv', message: 'columns do not match the meter profile' }],
      },
    );
  }
  const m = profile.mapping;
  const rows = records.map(({ line, cells }): ImportRow & { input?: z.output<typeof createReadingRequest> } => {
    const typedPoint = (body.bindings[String(line)] ?? cells[m.point] ?? '').trim();
    const point = points.get(typedPoint.toLowerCase()) ?? null;
    const refText = (m.reference ? cells[m.reference] : profile.defaultReference)?.trim() ?? '';
    const reference = points.get(refText.toLowerCase()) ?? (GROUND.has(refText.toLowerCase()) ? 'gnd' : refText);
    const mode = m.function ? meterFunctionOf(cells[m.function] ?? '') : profile.defaultMode;
    const raw = [cells[m.value] ?? '', m.unit ? (cells[m.unit] ?? '') : ''].join(' ').trim();
    const timeText = m.time ? (cells[m.time] ?? '').trim() : '';
    const taken = timeText ? Date.parse(timeText) : NaN;
    const base = { line, point, reference, mode, raw, value: null, takenAt: Number.isFinite(taken) ? new Date(taken).toISOString() : null, readingId: null };
    const fail = (error: string) => ({ ...base, error });
    if (!typedPoint) return fail(`no test point in column "${m.point}": bind the row to a test point`);
    if (!point) return fail(`"${typedPoint}" is not a test point of this board: bind the row to one`);
    if (!points.has(reference.toLowerCase()) && reference !== 'gnd') return fail(`reference "${refText}" is not a test point of this board, nor gnd`);
    if (!mode) return fail(`"${cells[m.function!] ?? ''}" is not a meter function (DC V, Ω, diode, continuity)`);
    const refused = powerRefusal(mode, profile.power);
    if (refused) return fail(refused);
    if (timeText && !Number.isFinite(taken)) return fail(`"${timeText}" is not a date and time`);
    const parsed = parseReadingInput(raw, mode === 'dcv' || mode === 'diode' ? 'V' : 'ohm');
    if (!parsed.ok) return fail(parsed.error);
    const input = createReadingRequest.safeParse({
      idempotencyKey: `${body.importKey}:${line}`,
      mode,
      red: point,
      black: reference,
      power: profile.power,
      value: parsed.value,
      raw,
      instrument: profile.name,
      phase: body.phase,
      ...(base.takenAt ? { takenAt: base.takenAt } : {}),
      ...(body.safetyCheck ? { safetyCheck: body.safetyCheck } : {}),
    });
    if (!input.success) return fail(input.error.issues.map((i) => i.message).join('; '));
    return { ...base, value: parsed.value, error: null, input: input.data };
  });
  return { columns, rows };
}

const result = (columns: string[], rows: ImportRow[], stored: number): MeterImportResult => ({
  columns,
  rows: rows.map(({ line, point, reference, mode, raw, value, takenAt, error, readingId }) => ({
    line,
    point,
    reference,
    mode,
    raw,
    value,
    takenAt,
    error,
    readingId,
  })),
  good: rows.filter((r) => !r.error).length,
  bad: rows.filter((r) => r.error).length,
  stored,
});

export async function previewImport({ db, actor, jobId, body }: { db: Db; actor: Actor; jobId: string; body: ImportBody }): Promise<MeterImportResult> {
  const { columns, rows } = await analyse(db, actor, jobId, body);
  return result(columns, rows, 0);
}

/**
 * Stores the good rows, each as a reading through the bench's own write (verdict, safety gate, job status).
 * Each row's key is the import's key and its line, so the same import sent again stores nothing twice.
 */
export async function importReadings({ db, actor, jobId, body }: { db: Db; actor: Actor; jobId: string; body: ImportBody }): Promise<MeterImportResult> {
  const { columns, rows } = await analyse(db, actor, jobId, body);
  const earlier = await db
    .select({ key: readings.idempotencyKey })
    .from(readings)
    .where(and(eq(readings.jobId, jobId), like(readings.idempotencyKey, `${body.importKey.replace(/[\\%_]/g, (c) => `\\${c}`)}:%`)));
  const seen = new Set(earlier.map((r) => r.key));
  let stored = 0;
  const done: ImportRow[] = [];
  // One row after the other: the first diagnosis reading moves the job, and each later one sees that.
  for (const row of rows) {
    if (!row.input) {
      done.push(row);
      continue;
    }
    try {
      const saved = await createReading({ db, actor, jobId, input: row.input });
      if (!seen.has(row.input.idempotencyKey)) stored += 1;
      done.push({ ...row, readingId: saved.id, takenAt: iso(new Date(saved.takenAt)) });
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      done.push({ ...row, error: err.message });
    }
  }
  return result(columns, done, stored);
}
