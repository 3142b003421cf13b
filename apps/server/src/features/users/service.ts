import { createHash } from 'node:crypto';
import { and, asc, count, desc, eq, gt, isNull } from 'drizzle-orm';
import type { AcceptInvitationRequest, CreateInvitationRequest, Invitation, Role, ShopMember } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Auth } from '../../auth/lucia';
import { hashPassword } from '../../auth/password';
import { forgetUserSessions } from '../../auth/session-cache';
import type { Db } from '../../db/client';
import { auditLog, invitations, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso, isoOrNull } from '../../lib/dates';
import { newId, newToken } from '../../lib/ids';

const INVITATION_DAYS = 7;
const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

const member = (u: typeof users.$inferSelect): ShopMember => ({ id: u.id, email: u.email, name: u.name, role: u.role, createdAt: iso(u.createdAt) });
const invitation = (i: typeof invitations.$inferSelect): Invitation => ({
  id: i.id,
  email: i.email,
  name: i.name,
  role: i.role,
  expiresAt: iso(i.expiresAt),
  acceptedAt: isoOrNull(i.acceptedAt),
  createdAt: iso(i.createdAt),
});

export async function findMembers({ db, shopId }: { db: Db; shopId: string }) {
  const rows = await db.select().from(users).where(eq(users.shopId, shopId)).orderBy(asc(users.name));
  return { items: rows.map(member) };
}

export async function updateMemberRole({ db, actor, id, role }: { db: Db; actor: Actor; id: string; role: Role }) {
  const updated = await db.transaction(async (tx) => {
    const [target] = await tx.select().from(users).where(and(eq(users.id, id), eq(users.shopId, actor.shopId))).for('update');
    if (!target) throw new AppError('not_found', `No user ${id}`);
    if (target.role === role) return member(target);
    if (target.role === 'admin') {
      const [admins] = await tx.select({ n: count() }).from(users).where(and(eq(users.shopId, actor.shopId), eq(users.role, 'admin')));
      if ((admins?.n ?? 0) <= 1) throw new AppError('conflict', 'A shop keeps at least one admin: make someone else admin first');
    }
    const [row] = await tx.update(users).set({ role }).where(eq(users.id, id)).returning();
    await tx.insert(auditLog).values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'role-change', subject: target.email, detail: `${target.role} → ${role}` });
    return member(row!);
  });
  // After the commit, so a request in between cannot keep the old role from a read of the old row.
  forgetUserSessions(id);
  return updated;
}

export async function findInvitations({ db, shopId }: { db: Db; shopId: string }) {
  const rows = await db.select().from(invitations).where(eq(invitations.shopId, shopId)).orderBy(desc(invitations.createdAt));
  return { items: rows.map(invitation) };
}

export async function createInvitation({ db, actor, input }: { db: Db; actor: Actor; input: CreateInvitationRequest }) {
  const [taken] = await db.select({ id: users.id }).from(users).where(eq(users.email, input.email));
  if (taken) throw new AppError('conflict', `${input.email} already has an account`);
  const token = newToken();
  const [row] = await db
    .insert(invitations)
    .values({ id: newId(), shopId: actor.shopId, email: input.email, name: input.name, role: input.role, tokenHash: tokenHash(token), invitedBy: actor.id, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) })
    .returning();
  await db.insert(auditLog).values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'invitation', subject: input.email, detail: `role ${input.role}` });
  return { ...invitation(row!), token, acceptPath: `/invitation/${token}` };
}

/** The invited person chooses a password; the account is created with the invited role and signed in. */
export async function acceptInvitation({ db, auth, input }: { db: Db; auth: Auth; input: AcceptInvitationRequest }) {
  const passwordHash = await hashPassword(input.password);
  const userId = await db.transaction(async (tx) => {
    const [inv] = await tx
      .select()
      .from(invitations)
      .where(and(eq(invitations.tokenHash, tokenHash(input.token)), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
      .for('update');
    if (!inv) throw new AppError('not_found', 'This invitation is unknown, used or expired; ask your shop admin for a new one');
    const [taken] = await tx.select({ id: users.id }).from(users).where(eq(users.email, inv.email));
    if (taken) throw new AppError('conflict', `${inv.email} already has an account`);
    const id = newId();
    await tx.insert(users).values({ id, shopId: inv.shopId, email: inv.email, name: inv.name, role: inv.role, passwordHash });
    await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, inv.id));
    await tx.insert(auditLog).values({ id: newId(), shopId: inv.shopId, userId: id, action: 'invitation-accepted', subject: inv.email, detail: `role ${inv.role}` });
    return id;
  });
  const session = await auth.createSession(userId, {});
  return { cookie: auth.createSessionCookie(session.id).serialize() };
}
