import { Router } from 'express';
import {
  acceptInvitationRequest,
  createInvitationRequest,
  createInvitationResponse,
  guidedLiftRoles,
  idParams,
  invitationListResponse,
  shopMemberSchema,
  traineeGuidedOrderRequest,
  updateUserRequest,
  userListResponse,
} from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { addressLimit } from '../../http/rate-limit';
import { acceptInvitation, createInvitation, findInvitations, findMembers, resendInvitation, setTraineeGuidedOrder, updateMember } from './service';

export function userRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/users', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(userListResponse.parse(await findMembers({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  r.get('/users/invitations', requireRole(...ROLES.admins), async (req, res) => {
    res.json(invitationListResponse.parse(await findInvitations({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  r.post('/users/invitations', requireRole(...ROLES.admins), async (req, res) => {
    const input = parse(createInvitationRequest, req.body);
    res.status(201).json(createInvitationResponse.parse(await createInvitation({ db: ctx.db, config: ctx.config, actor: actorOf(req), input })));
  });
  r.post('/users/invitations/:id/resend', requireRole(...ROLES.admins), async (req, res) => {
    const { id } = parse(idParams, req.params);
    res.json(createInvitationResponse.parse(await resendInvitation({ db: ctx.db, config: ctx.config, actor: actorOf(req), id })));
  });
  r.patch('/users/:id', requireRole(...ROLES.admins), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { role, active } = parse(updateUserRequest, req.body);
    res.json(shopMemberSchema.parse(await updateMember({ db: ctx.db, auth: ctx.auth, actor: actorOf(req), id, role, active })));
  });
  r.put('/users/:id/guided-order', requireRole(...guidedLiftRoles), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { lifted } = parse(traineeGuidedOrderRequest, req.body);
    res.json(shopMemberSchema.parse(await setTraineeGuidedOrder({ db: ctx.db, actor: actorOf(req), id, lifted })));
  });

  // Public (the invited person has no account yet), so rate-limited like sign-in.
  const limit = addressLimit(ctx.config.LOGIN_RATE_LIMIT * 5);
  r.post('/auth/accept-invitation', limit, async (req, res) => {
    const input = parse(acceptInvitationRequest, req.body);
    const { cookie } = await acceptInvitation({ db: ctx.db, auth: ctx.auth, input });
    res.append('Set-Cookie', cookie).status(204).end();
  });
  return r;
}
