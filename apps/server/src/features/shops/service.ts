import { count, eq, sql } from 'drizzle-orm';
import {
  readMeterProfileId,
  shopCardSchema,
  shopSchema,
  type AppMode,
  type FirstRunRequest,
  type Shop,
  type ShopCard,
  type UpdateShopRequest,
} from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Auth } from '../../auth/lucia';
import { hashPassword } from '../../auth/password';
import { assertPasswordAllowed } from '../../auth/password-policy';
import type { Db } from '../../db/client';
import { auditLog, billingSettings, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import type { Storage } from '../../storage/storage';
import { logoFromUpload } from './logo';

type Row = typeof shops.$inferSelect;

// The row's columns are the shop's fields; the schema keeps those the API shows (and drops created_at). A stored
// meter profile no longer shipped reads as none (the generic meter).
export const toShop = (r: Row): Shop => shopSchema.parse({ ...r, meterProfile: readMeterProfileId(r.meterProfile) });

/** What customers see of the shop (reports, e-mails, the customer page); never its session settings. */
export const toShopCard = (r: Row): ShopCard => shopCardSchema.parse({ ...r, hasLogo: r.logoUploadId !== null });

/** The first-run page is open only in shop mode and only until a shop exists. */
export async function setupStatus({ db, mode }: { db: Db; mode: AppMode }) {
  if (mode === 'demo') return { mode, needsSetup: false };
  const [n] = await db.select({ n: count() }).from(shops);
  return { mode, needsSetup: (n?.n ?? 0) === 0 };
}

/**
 * Creates the shop, its billing settings and its first admin, then signs the admin in. Two browsers sending the
 * form at once: the advisory lock orders them, and the second finds the shop already there (409).
 */
export async function runFirstRun({ db, auth, mode, input }: { db: Db; auth: Auth; mode: AppMode; input: FirstRunRequest }) {
  if (mode !== 'shop') throw new AppError('not_found', 'The first-run page exists only when the server runs in shop mode');
  assertPasswordAllowed(input.admin.password, input.admin.email);
  const passwordHash = await hashPassword(input.admin.password);
  const adminId = await db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext('splitscope:first-run'))`);
    const [n] = await tx.select({ n: count() }).from(shops);
    if ((n?.n ?? 0) > 0) throw new AppError('conflict', 'This shop is already set up: sign in instead');
    const shopId = newId();
    const { currency, ...details } = input.shop;
    await tx.insert(shops).values({ id: shopId, ...details });
    await tx.insert(billingSettings).values({ shopId, currency });
    const id = newId();
    await tx.insert(users).values({ id, shopId, email: input.admin.email, name: input.admin.name, role: 'admin', passwordHash });
    await tx.insert(auditLog).values({ id: newId(), shopId, userId: id, action: 'first-run', subject: input.admin.email, detail: input.shop.name });
    return id;
  });
  return { cookie: await auth.createSession(adminId) };
}

export async function getShopRow(db: Db, shopId: string): Promise<Row> {
  const [row] = await db.select().from(shops).where(eq(shops.id, shopId));
  if (!row) throw new AppError('not_found', `No shop ${shopId}`);
  return row;
}

export async function getShop({ db, shopId }: { db: Db; shopId: string }) {
  return toShop(await getShopRow(db, shopId));
}

/** Admin only. A logo given as an upload of the shop is kept as a copy fitted to a header (logo.ts). */
export async function updateShop({ db, storage, actor, input }: { db: Db; storage: Storage; actor: Actor; input: UpdateShopRequest }) {
  const values = input.logoUploadId
    ? { ...input, logoUploadId: await logoFromUpload({ db, storage, shopId: actor.shopId, userId: actor.id, uploadId: input.logoUploadId }) }
    : input;
  const [row] = await db.update(shops).set(values).where(eq(shops.id, actor.shopId)).returning();
  if (!row) throw new AppError('not_found', `No shop ${actor.shopId}`);
  await db
    .insert(auditLog)
    .values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'shop-details', subject: row.name, detail: Object.keys(input).join(', ') });
  return toShop(row);
}
