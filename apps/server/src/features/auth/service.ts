import { eq } from 'drizzle-orm';
import type { Me, SignInRequest } from '@splitscope/contract';
import type { Auth } from '../../auth/lucia';
import { hashPassword, verifyPassword } from '../../auth/password';
import type { Db } from '../../db/client';
import { auditLog, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';

// A hash to verify against when the e-mail is unknown, so timing does not tell which accounts exist.
let dummyHash: Promise<string> | undefined;
const getDummyHash = () => (dummyHash ??= hashPassword('not-a-real-password'));

export async function signIn({ db, auth, input, address }: { db: Db; auth: Auth; input: SignInRequest; address: string }) {
  const [user] = await db.select().from(users).where(eq(users.email, input.email)).limit(1);
  const ok = await verifyPassword(user?.passwordHash ?? (await getDummyHash()), input.password);
  if (!user || !ok) {
    await db.insert(auditLog).values({ id: newId(), shopId: user?.shopId ?? null, userId: user?.id ?? null, action: 'sign-in-failed', subject: input.email, detail: address });
    throw new AppError('unauthorized', 'E-mail or password is wrong');
  }
  const session = await auth.createSession(user.id, {});
  await db.insert(auditLog).values({ id: newId(), shopId: user.shopId, userId: user.id, action: 'sign-in', subject: user.email, detail: address });
  return { cookie: auth.createSessionCookie(session.id).serialize() };
}

export async function signOut({ auth, sessionId }: { auth: Auth; sessionId?: string }) {
  if (sessionId) await auth.invalidateSession(sessionId);
  return { cookie: auth.createBlankSessionCookie().serialize() };
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
