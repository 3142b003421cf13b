import { z } from 'zod';
import { roleSchema } from './auth';
import { idSchema, isoDateTime } from './common';

/** A member of the signed-in user's shop (for assignee pickers and the admin's people screen). */
export const shopMemberSchema = z.object({
  id: idSchema,
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  /** Set when an admin deactivated the person: they cannot sign in. */
  deactivatedAt: isoDateTime.nullable(),
  /** For a trainee: a lead lifted guided order on all their jobs (policy: guidedOrderBinds). False for everyone else. */
  guidedLifted: z.boolean(),
  createdAt: isoDateTime,
});
export type ShopMember = z.infer<typeof shopMemberSchema>;

export const userListResponse = z.object({ items: z.array(shopMemberSchema) });
export type UserList = z.infer<typeof userListResponse>;

/** Admin only: change a member's role, or deactivate / reactivate them (recorded in the audit log). */
export const updateUserRequest = z
  .object({ role: roleSchema.optional(), active: z.boolean().optional() })
  .refine((o) => o.role !== undefined || o.active !== undefined, 'nothing to change');
export type UpdateUserRequest = z.infer<typeof updateUserRequest>;

/** Leads and admins: lift (true) or restore (false) guided order for a trainee on all of that trainee's jobs. */
export const traineeGuidedOrderRequest = z.object({ lifted: z.boolean({ error: 'Say whether guided order is lifted (true) or restored (false)' }) });
export type TraineeGuidedOrderRequest = z.infer<typeof traineeGuidedOrderRequest>;

/** Admin only: invite someone to the shop; the link goes to them by e-mail and is also in the answer, once. */
export const createInvitationRequest = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  name: z.string().trim().min(1).max(200),
  role: roleSchema,
});
export type CreateInvitationRequest = z.infer<typeof createInvitationRequest>;

export const invitationSchema = z.object({
  id: idSchema,
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  expiresAt: isoDateTime,
  acceptedAt: isoDateTime.nullable(),
  createdAt: isoDateTime,
});
export type Invitation = z.infer<typeof invitationSchema>;

/** The token is shown once, when the invitation is made; only its hash is stored. */
export const createInvitationResponse = invitationSchema.extend({ token: z.string(), acceptPath: z.string() });
export type CreatedInvitation = z.infer<typeof createInvitationResponse>;

export const invitationListResponse = z.object({ items: z.array(invitationSchema) });
export type InvitationList = z.infer<typeof invitationListResponse>;

/** Public: the invited person sets a password; answers with a session cookie (204). */
export const acceptInvitationRequest = z.object({
  token: z.string().min(10).max(200),
  password: z.string().min(10, 'use at least 10 characters').max(200),
});
// (the server also refuses commonly used passwords)
export type AcceptInvitationRequest = z.infer<typeof acceptInvitationRequest>;
