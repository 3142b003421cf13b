import { z } from 'zod';
import { BOUNDS, yearInBounds } from './bounds';

/** Row ids are opaque strings (UUIDs for new rows, readable fixed ids for the demo seed). */
export const idSchema = z.string().trim().min(1).max(100);

/** Timestamps travel as ISO 8601 strings. */
export const isoDateTime = z.string().datetime({ offset: true });

/** A timestamp a request sets (taken at, due, received): in the years of `BOUNDS`, not year 0000 or 275760. */
export const isoDateTimeInput = isoDateTime.refine(yearInBounds, `must be a date between ${BOUNDS.years.min} and ${BOUNDS.years.max}`);

/** Optional free text: an empty string means "none". */
export const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional();

/** The path parameter of `/:id` routes. */
export const idParams = z.object({ id: idSchema });

/**
 * Where a value holds the NUL character (U+0000), which no text column of PostgreSQL can store: the dotted path
 * of the first string or key that does, or null. Every request the server parses goes through this, so a NUL in
 * any field (a customer name, a quote line, `?q=%00`) is a readable 422, never an error from the database.
 */
export function nulPath(value: unknown, path: string[] = []): string | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path.join('.') || '(value)' : null;
  if (!value || typeof value !== 'object') return null;
  for (const [k, v] of Object.entries(value)) {
    if (k.includes('\u0000')) return [...path, k].join('.');
    const found = nulPath(v, [...path, k]);
    if (found) return found;
  }
  return null;
}
