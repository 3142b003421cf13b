import { z } from 'zod';

/** The lead's figures of the shop, computed by the server from verified and returned jobs and the billing records. */
export const shopStatsResponse = z.object({
  /** Parts replaced on jobs that were signed off, per board model, most first. */
  failuresByPart: z.array(z.object({ boardName: z.string(), part: z.string(), count: z.number().int() })),
  /** Hours from intake to the last verification reading, per board model (median over its signed-off jobs). */
  intakeToVerified: z.array(z.object({ boardName: z.string(), jobs: z.number().int(), medianHours: z.number(), longestHours: z.number() })),
  /** Signed-off jobs whose board did not come back within the warranty days, of all signed-off jobs with a serial. */
  firstTimeFix: z.object({ fixed: z.number().int(), total: z.number().int(), warrantyDays: z.number().int() }),
  /** Jobs that were warranty returns of an earlier job. */
  repeatReturns: z.array(
    z.object({ jobNumber: z.number().int(), earlierJobNumber: z.number().int(), serial: z.string(), boardName: z.string(), daysSince: z.number().int() }),
  ),
  /** Money per month (integer cents, the shop's currency): quoted (sent or answered quotes), invoiced (not void), paid. */
  money: z.array(z.object({ month: z.string(), quotedCents: z.number().int(), invoicedCents: z.number().int(), paidCents: z.number().int() })),
  currency: z.string(),
});
export type ShopStats = z.infer<typeof shopStatsResponse>;

/** The median of a list of numbers (the mean of the middle two for an even count); 0 for none. */
export function median(values: readonly number[]): number {
  if (!values.length) return 0;
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}
