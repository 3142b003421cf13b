import { z } from 'zod';

/** RFC 9457 problem details, the one error shape of the API. */
export const problemSchema = z.object({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  detail: z.string(),
  code: z.string(),
  /** For validation failures: the failing fields, as dotted paths with their messages. */
  errors: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  /** For refused status changes: the allowed next states. */
  allowed: z.array(z.string()).optional(),
});
export type Problem = z.infer<typeof problemSchema>;

export const healthResponse = z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['ok', 'down']) });
export type Health = z.infer<typeof healthResponse>;
