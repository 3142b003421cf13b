import { z } from 'zod';

/**
 * The meter profiles the engine ships (packages/circuit meter-profiles.ts holds their values: test sources per
 * range, accuracy per function). A shop picks its default; a job may name another, chosen at intake or on the
 * bench. Expected values and bands of the job's readings are computed with the job's profile.
 */
export const meterProfileIds = ['cc-autorange-6000', 'analog-thevenin-20k'] as const;
export const meterProfileIdSchema = z.enum(meterProfileIds);
export type MeterProfileId = z.infer<typeof meterProfileIdSchema>;

export const meterProfileLabels: Record<MeterProfileId, string> = {
  'cc-autorange-6000': 'Autoranging handheld, 6000 counts (constant-current Ω)',
  'analog-thevenin-20k': 'Analog-style meter, 20 kΩ/V (battery Ω)',
};

/** What a meter without a chosen profile is read as: the engine's generic meter (typical values from memory). */
export const GENERIC_METER_LABEL = 'Generic meter (typical values)';

/** A stored profile id as the contract's type: an id no longer shipped reads as none (the default applies). */
export const readMeterProfileId = (x: string | null | undefined): MeterProfileId | null => {
  const parsed = meterProfileIdSchema.safeParse(x);
  return parsed.success ? parsed.data : null;
};
