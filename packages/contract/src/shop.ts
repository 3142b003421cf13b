import { z } from 'zod';
import { idSchema, optionalText } from './common';
import { meterProfileIdSchema } from './meter-profiles';

export const MIN_PASSWORD_LENGTH = 10;
/** Length only; the server also refuses commonly used passwords (a list it ships). */
export const newPasswordSchema = z.string().min(MIN_PASSWORD_LENGTH, `use at least ${MIN_PASSWORD_LENGTH} characters`).max(200);

/** `demo`: the invented demo shop is seeded; `shop`: a real shop, set up once on the first-run page. */
export const appModes = ['demo', 'shop'] as const;
export const appModeSchema = z.enum(appModes);
export type AppMode = z.infer<typeof appModeSchema>;

/** Public: which mode the server runs in and whether the first-run page is still open. */
export const setupStatusResponse = z.object({ mode: appModeSchema, needsSetup: z.boolean() });
export type SetupStatus = z.infer<typeof setupStatusResponse>;

const email = z.string().trim().toLowerCase().email().max(254);
const optionalEmail = z
  .union([z.literal(''), email])
  .transform((s) => (s === '' ? null : s))
  .nullable()
  .optional();

/** What customers see of the shop: on reports, e-mails and the customer page. */
export const shopDetailsFields = z.object({
  name: z.string().trim().min(1).max(200),
  address: optionalText(500),
  phone: optionalText(50),
  email: optionalEmail,
  taxNumber: optionalText(50),
});

/** Public, once: creates the shop and its first admin, and signs the admin in (204 with a session cookie). */
export const firstRunRequest = z.object({
  shop: shopDetailsFields.extend({
    currency: z
      .string()
      .trim()
      .toLowerCase()
      .regex(/^[a-z]{3}$/, 'a three-letter currency code'),
  }),
  admin: z.object({ name: z.string().trim().min(1).max(200), email, password: newPasswordSchema }),
});
export type FirstRunRequest = z.infer<typeof firstRunRequest>;

export const shopSchema = z.object({
  id: idSchema,
  name: z.string(),
  address: z.string().nullable(),
  phone: z.string().nullable(),
  email: z.string().nullable(),
  taxNumber: z.string().nullable(),
  logoUploadId: z.string().nullable(),
  sessionIdleHours: z.number().int(),
  sessionMaxDays: z.number().int(),
  /** The meter profile jobs use unless they name another; null = the engine's generic meter. */
  meterProfile: meterProfileIdSchema.nullable(),
});
export type Shop = z.infer<typeof shopSchema>;

/** The shop as its customers see it, on the report PDF, the quote and invoice e-mails and the customer page. */
export const shopCardSchema = z.object({
  name: z.string(),
  address: z.string().nullable(),
  phone: z.string().nullable(),
  email: z.string().nullable(),
  taxNumber: z.string().nullable(),
  /** Whether the shop has a logo (the customer page fetches it through its link). */
  hasLogo: z.boolean(),
});
export type ShopCard = z.infer<typeof shopCardSchema>;

/** The card's contact lines in reading order: the address (one line per line typed), phone, e-mail, tax number. */
export function shopCardLines(s: ShopCard): string[] {
  return [
    ...(s.address ?? '')
      .split(/\r?\n/)
      .map((l) => l.trim())
      .filter(Boolean),
    ...(s.phone ? [`Phone ${s.phone}`] : []),
    ...(s.email ? [s.email] : []),
    ...(s.taxNumber ? [`Tax number ${s.taxNumber}`] : []),
  ];
}

/** Admin only. The logo is an upload of the shop (PNG or JPEG); null removes it. */
export const updateShopRequest = shopDetailsFields
  .partial()
  .extend({
    logoUploadId: idSchema.nullable().optional(),
    sessionIdleHours: z
      .number()
      .int()
      .min(1)
      .max(24 * 7)
      .optional(),
    sessionMaxDays: z.number().int().min(1).max(90).optional(),
    meterProfile: meterProfileIdSchema.nullable().optional(),
  })
  .refine((o) => Object.keys(o).length > 0, 'nothing to change');
export type UpdateShopRequest = z.infer<typeof updateShopRequest>;

/** Signed in: a new password needs the current one; every other session of the person ends. */
export const changePasswordRequest = z.object({ currentPassword: z.string().min(1).max(200), newPassword: newPasswordSchema });
export type ChangePasswordRequest = z.infer<typeof changePasswordRequest>;

/** Public: mails a reset link when the address has an account; answers the same (202) either way. */
export const passwordResetRequest = z.object({ email });
export type PasswordResetRequest = z.infer<typeof passwordResetRequest>;

/** Public: the link's token (single use, 30 minutes) and the new password; every session of the person ends. */
export const passwordResetConfirm = z.object({ token: z.string().min(10).max(200), password: newPasswordSchema });
export type PasswordResetConfirm = z.infer<typeof passwordResetConfirm>;
