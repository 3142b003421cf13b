import { createHash } from 'node:crypto';
import { and, asc, count, desc, eq, gt, isNull } from 'drizzle-orm';
import {
  traineeLiftRefusal,
  type AcceptInvitationRequest,
  type CreateInvitationRequest,
  type Invitation,
  type Role,
  type ShopMember,
} from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Auth } from '../../auth/lucia';
import { hashPassword } from '../../auth/password';
import { assertPasswordAllowed } from '../../auth/password-policy';
import { forgetUserSessions } from '../../auth/session-cache';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { auditLog, invitations, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso, isoOrNull } from '../../lib/dates';
import { newId, newToken } from '../../lib/ids';
import { publicBase } from '../billing';
import { invitationMail, sendMail } from '../mail';

const INVITATION_DAYS = 7;
export const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

const member = (u: typeof users.$inferSelect): ShopMember => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  deactivatedAt: isoOrNull(u.deactivatedAt),
  guidedLifted: u.role === 'trainee' && u.guidedLiftedBy !== null,
  createdAt: iso(u.createdAt),
});
const invitation = (i: typeof invitations.$inferSelect): Invitation => ({
  id: i.id,
  email: i.email,
  name: i.name,
  role: i.role,
  expiresAt: iso(i.expiresAt),
  acceptedAt: isoOrNull(i.acceptedAt),
  createdAt: iso(i.createdAt),
});

const roleWords: Record<Role, string> = { admin: 'shop admin', lead: 'lead', tech: 'technician', trainee: 'trainee' };

export async function findMembers({ db, shopId }: { db: Db; shopId: string }) {
  const rows = await db.select().from(users).where(eq(users.shopId, shopId)).orderBy(asc(users.name));
  return { items: rows.map(member) };
}

/** Role change and deactivation; the shop keeps at least one active admin, and a deactivated person's sessions end. */
export async function updateMember({ db, auth, actor, id, role, active }: { db: Db; auth: Auth; actor: Actor; id: string; role?: Role; active?: boolean }) {
  const updated = await db.transaction(async (tx) => {
    // Every admin row of the shop locked in one order: two admins demoting each other at once cannot both pass.
    await tx
      .select({ id: users.id })
      .from(users)
      .where(and(eq(users.shopId, actor.shopId), eq(users.role, 'admin')))
      .orderBy(asc(users.id))
      .for('update');
    const [target] = await tx
      .select()
      .from(users)
      .where(and(eq(users.id, id), eq(users.shopId, actor.shopId)))
      .for('update');
    if (!target) throw new AppError('not_found', `No user ${id}`);
    const nextRole = role ?? target.role;
    const nextActive = active ?? !target.deactivatedAt;
    if (nextRole === target.role && nextActive === !target.deactivatedAt) return member(target);
    if (target.role === 'admin' && !target.deactivatedAt && (nextRole !== 'admin' || !nextActive)) {
      const [admins] = await tx
        .select({ n: count() })
        .from(users)
        .where(and(eq(users.shopId, actor.shopId), eq(users.role, 'admin'), isNull(users.deactivatedAt)));
      if ((admins?.n ?? 0) <= 1) throw new AppError('conflict', 'A shop keeps at least one admin: make someone else admin first');
    }
    const [row] = await tx
      .update(users)
      .set({ role: nextRole, deactivatedAt: nextActive ? null : (target.deactivatedAt ?? new Date()) })
      .where(eq(users.id, id))
      .returning();
    const audit = (action: string, detail: string) =>
      tx.insert(auditLog).values({ id: newId(), shopId: actor.shopId, userId: actor.id, action, subject: target.email, detail });
    if (nextRole !== target.role) await audit('role-change', `${target.role} → ${nextRole}`);
    if (nextActive !== !target.deactivatedAt) await audit(nextActive ? 'reactivated' : 'deactivated', target.name);
    return member(row!);
  });
  // After the commit, so a request in between cannot keep the old role from a read of the old row.
  if (active === false) await auth.invalidateUserSessions(id);
  else forgetUserSessions(id);
  return updated;
}

/**
 * A lead lifts guided order for a trainee on all of that trainee's jobs (or puts it back). Recorded in the audit
 * log; the readings service asks the policy with this flag beside the job's own.
 */
export async function setTraineeGuidedOrder({ db, actor, id, lifted }: { db: Db; actor: Actor; id: string; lifted: boolean }): Promise<ShopMember> {
  const [target] = await db
    .select()
    .from(users)
    .where(and(eq(users.id, id), eq(users.shopId, actor.shopId)));
  if (!target) throw new AppError('not_found', `No user ${id}`);
  const refused = traineeLiftRefusal(target.role);
  if (refused) throw new AppError('conflict', refused);
  const [row] = await db
    .update(users)
    .set({ guidedLiftedBy: lifted ? actor.id : null })
    .where(eq(users.id, id))
    .returning();
  await db.insert(auditLog).values({
    id: newId(),
    shopId: actor.shopId,
    userId: actor.id,
    action: lifted ? 'guided-order-lifted' : 'guided-order-restored',
    subject: target.email,
    detail: `${target.name}, all jobs`,
  });
  return member(row!);
}

/** Whether a lead lifted guided order on all of this person's jobs (the actor of a reading, the assignee of a job). */
export async function traineeGuidedLifted(db: Db, userId: string | null): Promise<boolean> {
  if (!userId) return false;
  const [u] = await db.select({ role: users.role, by: users.guidedLiftedBy }).from(users).where(eq(users.id, userId));
  return !!u && u.role === 'trainee' && u.by !== null;
}

export async function findInvitations({ db, shopId }: { db: Db; shopId: string }) {
  const rows = await db.select().from(invitations).where(eq(invitations.shopId, shopId)).orderBy(desc(invitations.createdAt));
  return { items: rows.map(invitation) };
}

async function mailInvitation(o: { db: Db; config: Config; row: typeof invitations.$inferSelect; token: string }) {
  const [shop] = await o.db.select({ name: shops.name }).from(shops).where(eq(shops.id, o.row.shopId));
  const url = `${publicBase(o.config)}/invitation/${o.token}`;
  const content = invitationMail(shop!.name, { name: o.row.name, role: roleWords[o.row.role] }, { url, expiresAt: o.row.expiresAt });
  await sendMail({ config: o.config, db: o.db, mail: { shopId: o.row.shopId, jobId: null, kind: 'invitation', to: o.row.email, ...content } });
}

export async function createInvitation({ db, config, actor, input }: { db: Db; config: Config; actor: Actor; input: CreateInvitationRequest }) {
  const [taken] = await db.select({ id: users.id }).from(users).where(eq(users.email, input.email));
  if (taken) throw new AppError('conflict', `${input.email} already has an account`);
  const token = newToken();
  const [row] = await db
    .insert(invitations)
    .values({
      id: newId(),
      shopId: actor.shopId,
      email: input.email,
      name: input.name,
      role: input.role,
      tokenHash: tokenHash(token),
      invitedBy: actor.id,
      expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
    })
    .returning();
  await db
    .insert(auditLog)
    .values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'invitation', subject: input.email, detail: `role ${input.role}` });
  await mailInvitation({ db, config, row: row!, token });
  return { ...invitation(row!), token, acceptPath: `/invitation/${token}` };
}

/** A fresh link for an open invitation: the old link stops working, the expiry starts again. */
export async function resendInvitation({ db, config, actor, id }: { db: Db; config: Config; actor: Actor; id: string }) {
  const token = newToken();
  const [row] = await db
    .update(invitations)
    .set({ tokenHash: tokenHash(token), expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) })
    .where(and(eq(invitations.id, id), eq(invitations.shopId, actor.shopId), isNull(invitations.acceptedAt)))
    .returning();
  if (!row) throw new AppError('not_found', `No open invitation ${id}`);
  await db
    .insert(auditLog)
    .values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: 'invitation-resent', subject: row.email, detail: `role ${row.role}` });
  await mailInvitation({ db, config, row, token });
  return { ...invitation(row), token, acceptPath: `/invitation/${token}` };
}

/** The invited person chooses a password; the account is created with the invited role and signed in. */
export async function acceptInvitation({ db, auth, input }: { db: Db; auth: Auth; input: AcceptInvitationRequest }) {
  const [open] = await db
    .select({ email: invitations.email })
    .from(invitations)
    .where(and(eq(invitations.tokenHash, tokenHash(input.token)), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())));
  assertPasswordAllowed(input.password, open?.email);
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
    await tx
      .insert(auditLog)
      .values({ id: newId(), shopId: inv.shopId, userId: id, action: 'invitation-accepted', subject: inv.email, detail: `role ${inv.role}` });
    return id;
  });
  return { cookie: await auth.createSession(userId) };
}
