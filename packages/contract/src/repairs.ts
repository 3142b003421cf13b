import { z } from 'zod';
import { idSchema, isoDateTime, optionalText } from './common';

export const repairActions = ['replaced', 'removed', 'reflowed', 'cleaned'] as const;
export const repairActionSchema = z.enum(repairActions);
export type RepairActionKind = z.infer<typeof repairActionSchema>;

export const createRepairRequest = z.object({
  part: z.string().trim().min(1).max(50),
  action: repairActionSchema,
  /** The fitted part's value ("10k", "1N4148-class"), when replaced. */
  replacementValue: optionalText(100),
  /** The marking on the fitted part, as read. */
  marking: optionalText(100),
  notes: optionalText(4000),
  /** Pictures of the work (ids from POST /api/uploads). */
  uploadIds: z.array(idSchema).max(20).default([]),
  /** A replaced part taken from the parts bin: the drawer, checked against the board model's part, and how many. */
  binPartId: idSchema.optional(),
  binQuantity: z.number().int().min(1).max(100).default(1),
});
export type CreateRepairRequest = z.input<typeof createRepairRequest>;

export const repairSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  part: z.string(),
  action: repairActionSchema,
  replacementValue: z.string().nullable(),
  marking: z.string().nullable(),
  notes: z.string().nullable(),
  uploadIds: z.array(idSchema),
  authorId: idSchema,
  authorName: z.string(),
  createdAt: isoDateTime,
});
export type Repair = z.infer<typeof repairSchema>;
export const repairListResponse = z.object({ items: z.array(repairSchema) });
export type RepairList = z.infer<typeof repairListResponse>;
