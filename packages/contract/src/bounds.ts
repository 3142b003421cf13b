// The physical and practical ranges of every number a request can carry, in one place. A value outside them is
// refused with a 422 that says the range, before any engine, database column or PDF sees it: 1e308 ohms is a
// typing slip, not a reading, and the engines are not asked to reason about it.
import { z } from 'zod';

export const BOUNDS = {
  /**
   * Meter DC volts, either polarity. Handheld multimeters measure up to 1000 V DC (their highest range and
   * the usual CAT III/IV rating: common practice); these boards' bus is about 300 V.
   */
  volts: { min: -1000, max: 1000 },
  /** Meter resistance. Handheld meters read to tens of megohms (common practice); a gigohm leaves room. */
  ohms: { min: 0, max: 1e9 },
  /** Board model versions and other counters stored in 32-bit integer columns (PostgreSQL `integer`). */
  counter: { min: 1, max: 2_147_483_647 },
  /** Dates a person or a bench can mean: the shop's records start after 2000 and plans end before 2100. */
  years: { min: 2000, max: 2099 },
  /**
   * A board model's part values and parameters in SI units (ohms, farads, volts, a CTR, a .param value): the
   * largest part value on these boards is a resistor in the megohms, so a gigohm either way leaves room (common practice).
   */
  boardValue: { min: -1e9, max: 1e9 },
  /** Positions and picture sizes on a board picture, in mm or px: a 100-megapixel photo is about 12,000 px wide. */
  boardCoordinate: { min: -20_000, max: 20_000 },
  /** A part's rotation on the picture, in degrees. */
  rotation: { min: -360, max: 360 },
  /** Motor speed-feedback pulses per revolution: fan motors give a handful (common practice). */
  pulsesPerRevolution: { min: 1, max: 1000 },
} as const;

/** A DC voltage as the meter shows it, in volts. */
export const voltsSchema = z
  .number()
  .refine(Number.isFinite, 'must be a finite number of volts')
  .min(BOUNDS.volts.min, `must be at least ${BOUNDS.volts.min} V`)
  .max(BOUNDS.volts.max, `must be at most ${BOUNDS.volts.max} V (the meter's highest DC range)`);

/** A resistance as the meter shows it, in ohms. */
export const ohmsSchema = z
  .number()
  .refine(Number.isFinite, 'must be a finite number of ohms')
  .min(BOUNDS.ohms.min, 'a resistance cannot be negative')
  .max(BOUNDS.ohms.max, `must be at most ${BOUNDS.ohms.max} ohm; above that the meter shows OL`);

/** A positive integer that fits a PostgreSQL `integer` column (versions, job numbers). */
export const counterSchema = z.number().int().min(BOUNDS.counter.min).max(BOUNDS.counter.max);

/** Whether an ISO 8601 timestamp falls in the years the shop's records can mean. */
export function yearInBounds(iso: string): boolean {
  const t = Date.parse(iso);
  if (!Number.isFinite(t)) return false;
  const y = new Date(t).getUTCFullYear();
  return y >= BOUNDS.years.min && y <= BOUNDS.years.max;
}

/** A bounded number of a board model, refused in words when it is not finite or out of its range. */
export function boardNumber(range: { min: number; max: number }, what: string, unit = '') {
  const u = unit ? ` ${unit}` : '';
  return z
    .number()
    .refine(Number.isFinite, `${what} must be a finite number`)
    .min(range.min, `${what} must be at least ${range.min}${u}`)
    .max(range.max, `${what} must be at most ${range.max}${u}`);
}
