import { createHash } from 'node:crypto';
import { and, asc, eq } from 'drizzle-orm';
import type { Upload } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { uploadRefusals, uploads } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import type { Storage } from '../../storage/storage';
import { getJobRow } from '../../db/job-row';
import { fitPicture } from './picture';

const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const JPEG = Buffer.from([0xff, 0xd8, 0xff]);

/** The picture type from its first bytes (PNG and JPEG signatures); whatever the name or header claim. */
export function sniffImage(bytes: Buffer): 'image/png' | 'image/jpeg' | null {
  if (bytes.subarray(0, PNG.length).equals(PNG)) return 'image/png';
  if (bytes.subarray(0, JPEG.length).equals(JPEG)) return 'image/jpeg';
  return null;
}

const toUpload = (u: typeof uploads.$inferSelect): Upload => ({
  id: u.id,
  jobId: u.jobId,
  contentType: u.contentType as Upload['contentType'],
  size: u.size,
  width: u.width,
  height: u.height,
  originalSize: u.originalSize,
  sha256: u.sha256,
  name: u.name,
  url: `/api/uploads/${u.id}`,
  createdBy: u.createdBy,
  createdAt: iso(u.createdAt),
});

export async function createUpload({
  db,
  storage,
  actor,
  bytes,
  jobId,
  name,
}: {
  db: Db;
  storage: Storage;
  actor: Actor;
  bytes: Buffer;
  jobId?: string;
  name?: string | null;
}) {
  if (jobId) await getJobRow(db, actor.shopId, jobId);
  try {
    return await storeUpload({ db, storage, shopId: actor.shopId, createdBy: actor.id, bytes, jobId, name });
  } catch (err) {
    // A picture refused for a job is kept on the job's record: the job shows it, where it can be sent again.
    if (jobId && err instanceof AppError && (err.code === 'unsupported_media_type' || err.code === 'invalid' || err.code === 'too_large')) {
      await db
        .insert(uploadRefusals)
        .values({ id: newId(), shopId: actor.shopId, jobId, name: name ?? null, size: bytes.length, reason: err.detail, createdBy: actor.id });
    }
    throw err;
  }
}

export async function findUploadRefusals({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }) {
  await getJobRow(db, shopId, jobId);
  const rows = await db
    .select()
    .from(uploadRefusals)
    .where(and(eq(uploadRefusals.shopId, shopId), eq(uploadRefusals.jobId, jobId)))
    .orderBy(asc(uploadRefusals.createdAt));
  return {
    items: rows.map((r) => ({ id: r.id, jobId: r.jobId, name: r.name, size: r.size, reason: r.reason, createdBy: r.createdBy, createdAt: iso(r.createdAt) })),
  };
}

/** Stores a picture's bytes and its row; the type comes from the bytes, and a refused type stores nothing. */
export async function storeUpload({
  db,
  storage,
  shopId,
  createdBy,
  bytes,
  jobId,
  name,
}: {
  db: Db;
  storage: Storage;
  shopId: string;
  createdBy: string;
  bytes: Buffer;
  jobId?: string | null;
  name?: string | null;
}): Promise<Upload> {
  if (bytes.length === 0) throw new AppError('invalid', 'The upload is empty');
  const type = sniffImage(bytes);
  if (!type) throw new AppError('unsupported_media_type', 'Only PNG and JPEG pictures are accepted (checked from the file contents; SVG is refused)');
  // A phone photo of several MB is stored at a size a screen and a report can use (picture.ts).
  const fitted = await fitPicture(bytes, type);
  const id = newId();
  const key = `${shopId}/${id}`;
  await storage.put(key, fitted.bytes);
  try {
    const [row] = await db
      .insert(uploads)
      .values({
        id,
        shopId,
        jobId: jobId ?? null,
        contentType: fitted.type,
        size: fitted.bytes.length,
        sha256: createHash('sha256').update(fitted.bytes).digest('hex'),
        name: name ?? null,
        storageKey: key,
        createdBy,
        width: fitted.width,
        height: fitted.height,
        originalSize: fitted.bytes === bytes ? null : bytes.length,
      })
      .returning();
    return toUpload(row!);
  } catch (err) {
    await storage.delete(key);
    throw err;
  }
}

export async function getUploadBytes({ db, storage, shopId, id }: { db: Db; storage: Storage; shopId: string; id: string }) {
  const [row] = await db
    .select()
    .from(uploads)
    .where(and(eq(uploads.id, id), eq(uploads.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No upload ${id}`);
  const bytes = await storage.get(row.storageKey);
  if (!bytes) throw new AppError('not_found', `The picture ${id} is missing from storage`);
  return { contentType: row.contentType, bytes };
}

export async function findUploads({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }) {
  await getJobRow(db, shopId, jobId);
  const rows = await db
    .select()
    .from(uploads)
    .where(and(eq(uploads.shopId, shopId), eq(uploads.jobId, jobId)));
  return { items: rows.map(toUpload) };
}
