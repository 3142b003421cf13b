// A reading taken by the bench meter over SCPI: the bench page asks for it ("arms" a test), a bridge process
// beside the meter picks the request up, configures the meter, and sends back the meter's own answer, which the
// server reads with `readScpiNumber` and stores through the same write as a typed reading.
import { z } from 'zod';
import { idSchema, isoDateTime } from './common';
import { powerStateSchema, readingPhaseSchema, readingSchema } from './readings';
import { safetyCheckSchema } from './safety-gate';

/**
 * The meter functions the bridge can set over SCPI, with the command that selects each. CONFigure:VOLTage:DC,
 * CONFigure:RESistance and CONFigure:DIODe are the SCPI instrument-class names for a digital multimeter (SCPI-99,
 * Volume 4, "Digital Meter"; from memory). Continuity is left to the bench: the meter's beep is heard, not sent,
 * so a continuity test is answered Beep / No beep on the page.
 */
export const benchMeterModes = ['dcv', 'ohm', 'diode'] as const;
export const benchMeterModeSchema = z.enum(benchMeterModes);
export type BenchMeterMode = z.infer<typeof benchMeterModeSchema>;
export const SCPI_CONFIGURE: Record<BenchMeterMode, string> = { dcv: 'CONF:VOLT:DC', ohm: 'CONF:RES', diode: 'CONF:DIOD' };

/**
 * How the reading is triggered: `meter` waits for the meter's own trigger (TRIGger:SOURce EXTernal, then READ?
 * answers when the technician presses it); `now` reads at once (TRIGger:SOURce IMMediate, READ?).
 */
export const benchMeterTriggers = ['meter', 'now'] as const;
export const benchMeterTriggerSchema = z.enum(benchMeterTriggers);
export type BenchMeterTrigger = z.infer<typeof benchMeterTriggerSchema>;
export const SCPI_TRIGGER_SOURCE: Record<BenchMeterTrigger, string> = { meter: 'TRIG:SOUR EXT', now: 'TRIG:SOUR IMM' };

/** SCPI's numbers for infinity and not-a-number (SCPI-99, Volume 1, 7.2.1.5: 9.9E37, -9.9E37, 9.91E37; from memory). */
const SCPI_INFINITY = 9.9e37;
const SCPI_NAN = 9.91e37;
// An NR1/NR2/NR3 number as IEEE 488.2 (8.7.2-8.7.4) sends it: sign, digits, optional point and exponent.
const SCPI_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(E[+-]?\d+)?$/i;

export type ScpiNumber = { ok: true; value: number | 'OL' } | { ok: false; error: string };

/**
 * One value as a SCPI meter answers READ?: "+3.1102E+02" is 311.02 (in volts or ohms, the function's base unit),
 * ±9.9E37 is overload, shown as OL as the meter's display does. Anything else, not-a-number (9.91E37) included, is
 * refused with the text quoted: a reading the server cannot read is never stored as a number.
 */
export function readScpiNumber(answer: string): ScpiNumber {
  const text = answer.trim();
  const quoted = text.length > 40 ? `${text.slice(0, 40)}…` : text;
  if (!SCPI_NUMBER.test(text)) return { ok: false, error: `the meter answered "${quoted}", which is not a number` };
  const n = Number(text);
  if (!Number.isFinite(n)) return { ok: false, error: `the meter answered "${quoted}", which is not a number` };
  // Compared with a tolerance: "9.90000000E+37" and "9.9E37" are the same overload.
  const near = (x: number) => Math.abs(Math.abs(n) - x) <= x * 1e-6;
  if (near(SCPI_NAN)) return { ok: false, error: `the meter answered "${quoted}" (not a number in SCPI): take the reading again` };
  if (near(SCPI_INFINITY)) return { ok: true, value: 'OL' };
  return { ok: true, value: n };
}

/** Asks the bench meter for one reading of this test, for the signed-in person's bridge. */
export const armBenchMeterRequest = z.object({
  mode: benchMeterModeSchema,
  red: z.string().trim().min(1).max(100),
  black: z.string().trim().min(1).max(100),
  power: powerStateSchema,
  lifted: z.array(z.string().trim().min(1).max(50)).max(20).default([]),
  phase: readingPhaseSchema.default('diagnosis'),
  trigger: benchMeterTriggerSchema.default('meter'),
  /** The discharge gate passed on the page, for an unpowered reading on the bus: stored with the reading. */
  safetyCheck: safetyCheckSchema.optional(),
});
export type ArmBenchMeterRequest = z.input<typeof armBenchMeterRequest>;
export type ArmBenchMeterInput = z.output<typeof armBenchMeterRequest>;

export const benchMeterArmStates = ['waiting', 'taken', 'refused', 'cancelled'] as const;

export const benchMeterArmSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  mode: benchMeterModeSchema,
  red: z.string(),
  black: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()),
  phase: readingPhaseSchema,
  trigger: benchMeterTriggerSchema,
  armedAt: isoDateTime,
  state: z.enum(benchMeterArmStates),
  /** The server has the expected value of this test at hand: the reading is judged as soon as the meter sends it. */
  ready: z.boolean(),
  /** The stored reading once the meter's answer was accepted. */
  reading: readingSchema.nullable(),
  /** Why the meter's answer was not stored, in the words the server refused it with. */
  refusal: z.string().nullable(),
});
export type BenchMeterArm = z.infer<typeof benchMeterArmSchema>;

/** The bridge signed in as this person, as last seen by the server. */
export const benchMeterBridgeSchema = z.object({ instrument: z.string().nullable(), seenAt: isoDateTime, connected: z.boolean() });

/** What the bench page polls: this person's request on this job (the latest), and their bridge. */
export const benchMeterStatusResponse = z.object({ arm: benchMeterArmSchema.nullable(), bridge: benchMeterBridgeSchema.nullable() });
export type BenchMeterStatus = z.infer<typeof benchMeterStatusResponse>;

/** The page's poll: `since` is the request as the page shows it ("id:state:ready", or "none"); `wait` seconds at most. */
export const benchMeterStatusQuery = z.object({ since: z.string().trim().max(200).optional(), wait: z.coerce.number().int().min(0).max(20).default(0) });

/** What the bridge asks for: the next request to serve, waiting up to `wait` seconds for one other than `after`. */
export const benchMeterNextQuery = z.object({
  after: z.string().trim().max(100).optional(),
  wait: z.coerce.number().int().min(0).max(30).default(0),
  /** The meter's *IDN? answer, so the bench can say which meter is connected. */
  instrument: z.string().trim().max(200).optional(),
});
export const benchMeterJobSchema = z.object({
  id: idSchema,
  mode: benchMeterModeSchema,
  configure: z.string(),
  triggerSource: z.string(),
  trigger: benchMeterTriggerSchema,
  label: z.string(),
});
export type BenchMeterJob = z.infer<typeof benchMeterJobSchema>;
export const benchMeterNextResponse = z.object({ request: benchMeterJobSchema.nullable() });

/** The meter's answer to READ?, as it sent it, and the meter's *IDN? answer. */
export const benchMeterReadingRequest = z.object({ answer: z.string().trim().min(1).max(100), instrument: z.string().trim().max(200).optional() });
export type BenchMeterReadingInput = z.output<typeof benchMeterReadingRequest>;

/**
 * The meter's name from its *IDN? answer: IEEE 488.2 (10.14) answers "maker,model,serial,firmware"; the first two
 * fields name it in the readings table ("Invented Instruments BM-2300"). Any other answer is kept as sent, cut short.
 */
export function instrumentName(idn: string): string {
  const fields = idn.split(',').map((f) => f.trim());
  const name = fields.length >= 2 && fields[0] && fields[1] ? `${fields[0]} ${fields[1]}` : idn.trim();
  return name.slice(0, 100) || 'bench meter';
}
export const benchMeterArmParams = z.object({ armId: idSchema });
