import { z } from 'zod';

/** Row ids are opaque strings (UUIDs for new rows, readable fixed ids for the demo seed). */
export const idSchema = z.string().trim().min(1).max(100);

/** Timestamps travel as ISO 8601 strings. */
export const isoDateTime = z.string().datetime({ offset: true });

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
