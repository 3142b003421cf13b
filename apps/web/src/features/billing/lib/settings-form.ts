// The billing settings form: validates as the API does but keeps the texts the API takes (rate "8.25").
import { jobStatusLabels, mailMilestoneSchema, taxRatePattern, type BillingSettings, type UpdateBillingSettingsRequest } from '@splitscope/contract';
import { z } from 'zod';

export const settingsFormSchema = z.object({
  currency: z
    .string()
    .trim()
    .regex(/^[A-Za-z]{3}$/, 'A three-letter currency code (ISO 4217), like USD or EUR'),
  taxRate: z.string().trim().regex(taxRatePattern, 'A rate in percent, like 8.25'),
  notifyOn: z.array(mailMilestoneSchema),
  linkValidDays: z.number({ error: 'A whole number of days' }).int('A whole number of days').min(1, 'At least 1 day').max(365, 'At most 365 days'),
  replyTo: z.union([z.literal(''), z.string().trim().email('An e-mail address, or leave it empty')]),
}) satisfies z.ZodType<UpdateBillingSettingsRequest>;

export type SettingsFormValues = z.input<typeof settingsFormSchema>;

export const settingsFormValues = (s: BillingSettings): SettingsFormValues => ({
  currency: s.currency.toUpperCase(),
  taxRate: s.taxRate,
  notifyOn: s.notifyOn,
  linkValidDays: s.linkValidDays,
  replyTo: s.replyTo ?? '',
});

export const milestoneOptions = mailMilestoneSchema.options.map((m) => ({ value: m, label: jobStatusLabels[m] }));
