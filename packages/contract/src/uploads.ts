import { z } from 'zod';
import { idSchema, isoDateTime, optionalText } from './common';

/** Board pictures only: the type is checked from the bytes, not the name or header. SVG is refused. */
export const uploadContentTypes = ['image/png', 'image/jpeg'] as const;
export const uploadContentTypeSchema = z.enum(uploadContentTypes);

/** POST /api/uploads takes the raw bytes as the body; these travel in the query string. */
export const uploadQuery = z.object({
  jobId: idSchema.optional(),
  name: optionalText(200),
});

export const uploadSchema = z.object({
  id: idSchema,
  jobId: idSchema.nullable(),
  contentType: uploadContentTypeSchema,
  size: z.number().int().nonnegative(),
  sha256: z.string(),
  name: z.string().nullable(),
  /** Where to GET the bytes. */
  url: z.string(),
  createdBy: idSchema,
  createdAt: isoDateTime,
});
export type Upload = z.infer<typeof uploadSchema>;
export const uploadListResponse = z.object({ items: z.array(uploadSchema) });
export type UploadList = z.infer<typeof uploadListResponse>;
