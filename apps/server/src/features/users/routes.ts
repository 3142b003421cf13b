import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import {
  acceptInvitationRequest,
  createInvitationRequest,
  createInvitationResponse,
  idParams,
  invitationListResponse,
  shopMemberSchema,
  updateUserRequest,
  userListResponse,
} from '@splitscope/contract';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { AppError, parse } from '../../http/errors';
import { acceptInvitation, createInvitation, findInvitations, findMembers, updateMemberRole } from './service';

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
    res.status(201).json(createInvitationResponse.parse(await createInvitation({ db: ctx.db, actor: actorOf(req), input })));
  });
  r.patch('/users/:id', requireRole(...ROLES.admins), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const { role } = parse(updateUserRequest, req.body);
    res.json(shopMemberSchema.parse(await updateMemberRole({ db: ctx.db, actor: actorOf(req), id, role })));
  });

  // Public (the invited person has no account yet), so rate-limited like sign-in.
  const limit = rateLimit({
    windowMs: 15 * 60_000,
    limit: ctx.config.LOGIN_RATE_LIMIT * 5,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: () => {
      throw new AppError('rate_limited', 'Too many attempts from this address; wait a few minutes and try again');
    },
  });
  r.post('/auth/accept-invitation', limit, async (req, res) => {
    const input = parse(acceptInvitationRequest, req.body);
    const { cookie } = await acceptInvitation({ db: ctx.db, auth: ctx.auth, input });
    res.append('Set-Cookie', cookie).status(204).end();
  });
  return r;
}
