import { z } from 'zod';
import { idSchema, isoDateTime, optionalText } from './common';

/** Who sends boards in: a contracting firm, or a field technician working on their own account. */
export const customerKinds = ['contractor', 'field-technician'] as const;
export const customerKindSchema = z.enum(customerKinds);
export type CustomerKind = z.infer<typeof customerKindSchema>;

export const customerSchema = z.object({
  id: idSchema,
  shopId: idSchema,
  name: z.string(),
  company: z.string().nullable(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
  kind: customerKindSchema,
  notes: z.string().nullable(),
  createdAt: isoDateTime,
});
export type Customer = z.infer<typeof customerSchema>;

export const createCustomerRequest = z.object({
  name: z.string().trim().min(1).max(200),
  company: optionalText(200),
  email: z
    .union([z.literal(''), z.string().trim().toLowerCase().email().max(254)])
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional(),
  phone: optionalText(50),
  kind: customerKindSchema,
  notes: optionalText(4000),
});
export type CreateCustomerRequest = z.infer<typeof createCustomerRequest>;

export const updateCustomerRequest = createCustomerRequest.partial().refine((o) => Object.keys(o).length > 0, 'nothing to change');
export type UpdateCustomerRequest = z.infer<typeof updateCustomerRequest>;

export const customerListQuery = z.object({
  q: z.string().trim().max(200).optional(),
  kind: customerKindSchema.optional(),
});
export type CustomerListQuery = z.infer<typeof customerListQuery>;

export const customerListResponse = z.object({ items: z.array(customerSchema) });
export type CustomerList = z.infer<typeof customerListResponse>;

/** Merge a duplicate into this customer: its jobs, quotes and invoices move here, then it is removed. */
export const mergeCustomerRequest = z.object({ duplicateId: idSchema });
export type MergeCustomerRequest = z.infer<typeof mergeCustomerRequest>;

export const mergeCustomerResponse = z.object({
  customer: customerSchema,
  moved: z.object({ jobs: z.number().int(), quotes: z.number().int(), invoices: z.number().int() }),
});
export type MergeCustomerResult = z.infer<typeof mergeCustomerResponse>;
