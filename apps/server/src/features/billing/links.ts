// Customer links: a random 256-bit token in the e-mail, only its sha256 in the database, an expiry, and the
// scope of one job. Changing one character of the token gives a hash that matches nothing.
import { and, eq, gt, isNull, ne } from 'drizzle-orm';
import { createHash } from 'node:crypto';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { customerLinks } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId, newToken } from '../../lib/ids';

export const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/; // 32 bytes in base64url

export const LINK_INVALID = 'This link is no longer valid. Ask the shop to send a new one.';

export function publicBase(config: Config): string {
  return (config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`).replace(/\/$/, '');
}

export async function createCustomerLink({
  db,
  config,
  shopId,
  jobId,
  validDays,
  createdBy,
  recipient = null,
}: {
  db: Db;
  config: Config;
  shopId: string;
  jobId: string;
  validDays: number;
  createdBy: string | null;
  /** who the link is mailed to; an answer given through the link is recorded as theirs */
  recipient?: { name: string; email: string } | null;
}): Promise<{ id: string; token: string; url: string; expiresAt: Date }> {
  const token = newToken();
  const id = newId();
  const expiresAt = new Date(Date.now() + validDays * 24 * 3600 * 1000);
  await db.insert(customerLinks).values({
    id,
    shopId,
    jobId,
    tokenHash: hashToken(token),
    expiresAt,
    createdBy,
    recipientName: recipient?.name ?? null,
    recipientEmail: recipient?.email ?? null,
  });
  return { id, token, url: `${publicBase(config)}/c/${token}`, expiresAt };
}

/** Revokes every live link of a job but `keep`: a quote sent now replaces what earlier links offered. */
export async function revokeEarlierLinks(db: Db, jobId: string, keep: string): Promise<number> {
  const rows = await db
    .update(customerLinks)
    .set({ revokedAt: new Date() })
    .where(and(eq(customerLinks.jobId, jobId), isNull(customerLinks.revokedAt), ne(customerLinks.id, keep)))
    .returning({ id: customerLinks.id });
  return rows.length;
}

export interface ResolvedLink {
  id: string;
  shopId: string;
  jobId: string;
  expiresAt: Date;
  recipientName: string | null;
  recipientEmail: string | null;
}

/** The link a token names, if it is intact, not expired and not revoked; otherwise one and the same 404. */
export async function resolveCustomerLink(db: Db, token: string): Promise<ResolvedLink> {
  if (!TOKEN_SHAPE.test(token)) throw new AppError('not_found', LINK_INVALID);
  const now = new Date();
  const [row] = await db
    .update(customerLinks)
    .set({ lastUsedAt: now })
    .where(and(eq(customerLinks.tokenHash, hashToken(token)), gt(customerLinks.expiresAt, now), isNull(customerLinks.revokedAt)))
    .returning({
      id: customerLinks.id,
      shopId: customerLinks.shopId,
      jobId: customerLinks.jobId,
      expiresAt: customerLinks.expiresAt,
      recipientName: customerLinks.recipientName,
      recipientEmail: customerLinks.recipientEmail,
    });
  if (!row) throw new AppError('not_found', LINK_INVALID);
  return row;
}
