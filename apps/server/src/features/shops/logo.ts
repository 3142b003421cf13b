// The shop's logo heads the report PDF and the customer page. The admin uploads any PNG or JPEG picture (the
// upload is decoded on arrival, uploads/picture.ts); setting it as the logo stores a copy fitted to a header
// (at most LOGO_BOX, PNG, `sharp`), so a 4000 px photo is not drawn into every report.
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { Db } from '../../db/client';
import { shops, uploads } from '../../db/schema';
import { AppError } from '../../http/errors';
import type { Storage } from '../../storage/storage';
import { storeUpload } from '../uploads';

/** The largest a logo is kept, px: twice the 300 × 100 pt it is drawn at on the PDF, for print. */
export const LOGO_BOX = { width: 600, height: 200 } as const;

/** The picture fitted inside LOGO_BOX as PNG (transparency kept); words for a file that is not a picture. */
async function fitLogo(bytes: Buffer): Promise<Buffer> {
  try {
    return await sharp(bytes, { limitInputPixels: 100_000_000 })
      .rotate()
      .resize({ ...LOGO_BOX, fit: 'inside', withoutEnlargement: true })
      .png()
      .toBuffer();
  } catch {
    throw new AppError('unsupported_media_type', 'The logo could not be read: choose a PNG or JPEG picture');
  }
}

/** Stores the fitted copy of an upload of the shop as a new upload; its id is what the shop row keeps. */
export async function logoFromUpload({
  db,
  storage,
  shopId,
  userId,
  uploadId,
}: {
  db: Db;
  storage: Storage;
  shopId: string;
  userId: string;
  uploadId: string;
}): Promise<string> {
  const [up] = await db
    .select()
    .from(uploads)
    .where(and(eq(uploads.id, uploadId), eq(uploads.shopId, shopId)));
  if (!up) throw new AppError('not_found', `No upload ${uploadId}`);
  const bytes = await storage.get(up.storageKey);
  if (!bytes) throw new AppError('not_found', `The picture ${uploadId} is missing from storage`);
  const stored = await storeUpload({ db, storage, shopId, createdBy: userId, bytes: await fitLogo(bytes), name: 'shop logo' });
  return stored.id;
}

/** The shop's logo (PNG or JPEG bytes), or null when it has none or its file is gone. */
export async function shopLogo({ db, storage, shopId }: { db: Db; storage: Storage; shopId: string }): Promise<{ bytes: Buffer; contentType: string } | null> {
  const [row] = await db
    .select({ key: uploads.storageKey, contentType: uploads.contentType })
    .from(shops)
    .innerJoin(uploads, and(eq(uploads.id, shops.logoUploadId), eq(uploads.shopId, shops.id)))
    .where(eq(shops.id, shopId));
  if (!row) return null;
  const bytes = await storage.get(row.key);
  return bytes ? { bytes, contentType: row.contentType } : null;
}
