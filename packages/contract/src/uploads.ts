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
  /** Pixel size as stored (a large photo is stored resized); null for pictures stored before it was measured. */
  width: z.number().int().positive().nullable().default(null),
  height: z.number().int().positive().nullable().default(null),
  /** Bytes as sent, when the stored picture was resized from them. */
  originalSize: z.number().int().positive().nullable().default(null),
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

/** A picture sent for a job that was not stored, and why: shown on the job, where it can be sent again. */
export const uploadRefusalSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  name: z.string().nullable(),
  size: z.number().int().nonnegative(),
  reason: z.string(),
  createdBy: idSchema,
  createdAt: isoDateTime,
});
export type UploadRefusal = z.infer<typeof uploadRefusalSchema>;
export const uploadRefusalListResponse = z.object({ items: z.array(uploadRefusalSchema) });
