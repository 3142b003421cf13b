import { and, eq, gt, isNull } from 'drizzle-orm';
import type { ChangePasswordRequest, Me, PasswordResetConfirm, SignInRequest } from '@splitscope/contract';
import type { Auth } from '../../auth/lucia';
import { hashPassword, verifyPassword } from '../../auth/password';
import { assertPasswordAllowed } from '../../auth/password-policy';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { auditLog, passwordResets, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId, newToken } from '../../lib/ids';
import { publicBase } from '../billing';
import { passwordResetMail, sendMail } from '../mail';
import { tokenHash } from '../users';

const RESET_MINUTES = 30;

// A hash to verify against when the e-mail is unknown, so timing does not tell which accounts exist.
let dummyHash: Promise<string> | undefined;
const getDummyHash = () => (dummyHash ??= hashPassword('not-a-real-password'));

const audit = (db: Db, row: Omit<typeof auditLog.$inferInsert, 'id'>) => db.insert(auditLog).values({ id: newId(), ...row });

export async function signIn({ db, auth, input, address }: { db: Db; auth: Auth; input: SignInRequest; address: string }) {
  const [user] = await db.select().from(users).where(eq(users.email, input.email)).limit(1);
  const ok = await verifyPassword(user?.passwordHash ?? (await getDummyHash()), input.password);
  if (!user || !ok) {
    await audit(db, { shopId: user?.shopId ?? null, userId: user?.id ?? null, action: 'sign-in-failed', subject: input.email, detail: address });
    throw new AppError('unauthorized', 'E-mail or password is wrong');
  }
  // Only after the right password, so the answer tells a stranger nothing about the account.
  if (user.deactivatedAt) {
    await audit(db, { shopId: user.shopId, userId: user.id, action: 'sign-in-deactivated', subject: user.email, detail: address });
    throw new AppError('forbidden', 'This account was deactivated by the shop admin');
  }
  const cookie = await auth.createSession(user.id);
  await audit(db, { shopId: user.shopId, userId: user.id, action: 'sign-in', subject: user.email, detail: address });
  return { cookie };
}

export async function signOut({ auth, sessionId }: { auth: Auth; sessionId?: string }) {
  if (sessionId) await auth.invalidateSession(sessionId);
  return { cookie: auth.blankCookie() };
}

/** Ends every session of the person, this one included (a lost tablet, a shared password). */
export async function signOutEverywhere({ db, auth, userId, shopId }: { db: Db; auth: Auth; userId: string; shopId: string }) {
  await auth.invalidateUserSessions(userId);
  await audit(db, { shopId, userId, action: 'sign-out-everywhere', subject: userId });
  return { cookie: auth.blankCookie() };
}

/** Needs the current password; the person's other sessions end and this browser gets a new one. */
export async function changePassword({ db, auth, userId, input }: { db: Db; auth: Auth; userId: string; input: ChangePasswordRequest }) {
  const [user] = await db.select().from(users).where(eq(users.id, userId));
  if (!user) throw new AppError('unauthorized', 'Sign in first');
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw new AppError('forbidden', 'The current password is wrong', { errors: [{ path: 'currentPassword', message: 'wrong password' }] });
  }
  assertPasswordAllowed(input.newPassword, user.email);
  await db
    .update(users)
    .set({ passwordHash: await hashPassword(input.newPassword) })
    .where(eq(users.id, userId));
  await auth.invalidateUserSessions(userId);
  await audit(db, { shopId: user.shopId, userId, action: 'password-changed', subject: user.email });
  return { cookie: await auth.createSession(userId) };
}

/**
 * Mails a reset link when the address belongs to an active account. The caller answers at once and the same
 * way for any address; the mail goes out after (`sent` is for the tests and the log).
 */
export function requestPasswordReset({ db, config, email }: { db: Db; config: Config; email: string }): { sent: Promise<boolean> } {
  const sent = (async () => {
    const [user] = await db
      .select({ id: users.id, name: users.name, email: users.email, shopId: users.shopId, shopName: shops.name })
      .from(users)
      .innerJoin(shops, eq(shops.id, users.shopId))
      .where(and(eq(users.email, email), isNull(users.deactivatedAt)));
    if (!user) return false;
    const token = newToken();
    const now = new Date();
    await db
      .insert(passwordResets)
      .values({ id: newId(), userId: user.id, tokenHash: tokenHash(token), createdAt: now, expiresAt: new Date(now.getTime() + RESET_MINUTES * 60_000) });
    await audit(db, { shopId: user.shopId, userId: user.id, action: 'password-reset-requested', subject: user.email });
    const content = passwordResetMail(user.shopName, user.name, { url: `${publicBase(config)}/reset-password/${token}`, minutes: RESET_MINUTES });
    await sendMail({ config, db, mail: { shopId: user.shopId, jobId: null, kind: 'password-reset', to: user.email, ...content } });
    return true;
  })();
  sent.catch((err: unknown) => console.error('splitscope: password reset mail failed:', (err as Error).message));
  return { sent };
}

/** Sets the new password from a reset link (once, within 30 minutes); every session ends, this browser signs in. */
export async function confirmPasswordReset({ db, auth, input }: { db: Db; auth: Auth; input: PasswordResetConfirm }) {
  const hash = tokenHash(input.token);
  const [open] = await db
    .select({ email: users.email })
    .from(passwordResets)
    .innerJoin(users, eq(users.id, passwordResets.userId))
    .where(and(eq(passwordResets.tokenHash, hash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date())));
  if (!open) throw new AppError('not_found', 'This reset link is unknown, used or expired; ask for a new one');
  assertPasswordAllowed(input.password, open.email);
  const passwordHash = await hashPassword(input.password);
  const userId = await db.transaction(async (tx) => {
    const [reset] = await tx
      .select()
      .from(passwordResets)
      .where(and(eq(passwordResets.tokenHash, hash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date())))
      .for('update');
    if (!reset) throw new AppError('not_found', 'This reset link is unknown, used or expired; ask for a new one');
    const [user] = await tx
      .update(users)
      .set({ passwordHash })
      .where(and(eq(users.id, reset.userId), isNull(users.deactivatedAt)))
      .returning();
    if (!user) throw new AppError('not_found', 'This reset link is unknown, used or expired; ask for a new one');
    // Every open link of the person ends with this one.
    await tx
      .update(passwordResets)
      .set({ usedAt: new Date() })
      .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt)));
    await tx.insert(auditLog).values({ id: newId(), shopId: user.shopId, userId: user.id, action: 'password-reset', subject: user.email });
    return user.id;
  });
  await auth.invalidateUserSessions(userId);
  return { cookie: await auth.createSession(userId) };
}

export async function getMe({ db, userId }: { db: Db; userId: string }): Promise<Me> {
  const [row] = await db
    .select({ id: users.id, email: users.email, name: users.name, role: users.role, shopId: users.shopId, shopName: shops.name })
    .from(users)
    .innerJoin(shops, eq(shops.id, users.shopId))
    .where(eq(users.id, userId));
  if (!row) throw new AppError('unauthorized', 'Sign in first');
  return row;
}
