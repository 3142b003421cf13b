import { z } from 'zod';

/**
 * The meter profiles the engine ships (packages/circuit meter-profiles.ts holds their values: test sources per
 * range, accuracy per function). A shop picks its default; a job may name another, chosen at intake or on the
 * bench. Expected values and bands of the job's readings are computed with the job's profile.
 */
export const meterProfileIds = ['cc-autorange-6000', 'analog-thevenin-20k'] as const;
export const meterProfileIdSchema = z.enum(meterProfileIds);
export type MeterProfileId = z.infer<typeof meterProfileIdSchema>;

/** The meters as a technician names them: the kind of meter, then how its Ω function drives the part. */
export const meterProfileLabels: Record<MeterProfileId, string> = {
  'cc-autorange-6000': 'Handheld autoranging (6000 counts), constant-current Ω',
  'analog-thevenin-20k': 'Analog needle meter (20 kΩ/V), battery-and-resistor Ω',
};

/** What a meter without a chosen profile is read as: the engine's generic meter (typical values from memory). */
export const GENERIC_METER_LABEL = 'Any meter (typical values, no meter chosen)';

/** Where the meter a job's expected values assume comes from. */
export const meterSources = ['job', 'shop', 'none'] as const;

/** The meter a job's expected values and bands assume: the job's own, else the shop's default, else none chosen. */
export const jobMeterSchema = z.object({
  profile: meterProfileIdSchema.nullable(),
  from: z.enum(meterSources),
  /** The meter in the bench's words (meterProfileLabels, or GENERIC_METER_LABEL). */
  label: z.string(),
});
export type JobMeter = z.infer<typeof jobMeterSchema>;

/** The one rule of which meter a job is read with: the job's choice wins over the shop's default. */
export function jobMeter(job: string | null | undefined, shop: string | null | undefined): JobMeter {
  const own = readMeterProfileId(job);
  const profile = own ?? readMeterProfileId(shop);
  return { profile, from: own ? 'job' : profile ? 'shop' : 'none', label: profile ? meterProfileLabels[profile] : GENERIC_METER_LABEL };
}

/** A stored profile id as the contract's type: an id no longer shipped reads as none (the default applies). */
export const readMeterProfileId = (x: string | null | undefined): MeterProfileId | null => {
  const parsed = meterProfileIdSchema.safeParse(x);
  return parsed.success ? parsed.data : null;
};
