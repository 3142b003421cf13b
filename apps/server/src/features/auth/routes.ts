import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import { changePasswordRequest, meResponse, passwordResetConfirm, passwordResetRequest, sessionResponse, signInRequest } from '@splitscope/contract';
import { actorOf, requireUser } from '../../auth/guards';
import { AppError, parse } from '../../http/errors';
import { addressLimit } from '../../http/rate-limit';
import type { AppContext } from '../../context';
import { changePassword, confirmPasswordReset, getMe, requestPasswordReset, signIn, signOut, signOutEverywhere } from './service';

export function authRoutes(ctx: AppContext): Router {
  const r = Router();
  const tooMany = (what: string) => () => {
    throw new AppError('rate_limited', `Too many failed sign-in attempts ${what}; wait a few minutes and try again`);
  };
  // Failed attempts only, per address and per account: a stolen list of e-mails cannot be sprayed from one
  // machine, one account cannot be guessed at from many, and a person signing in often locks nobody out.
  const common = { windowMs: 15 * 60_000, skipSuccessfulRequests: true, standardHeaders: 'draft-7', legacyHeaders: false } as const;
  const perAddress = rateLimit({ ...common, limit: ctx.config.LOGIN_RATE_LIMIT * 5, handler: tooMany('from this address') });
  const perAccount = rateLimit({
    ...common,
    limit: ctx.config.LOGIN_RATE_LIMIT,
    keyGenerator: (req) =>
      String((req.body as { email?: unknown })?.email ?? '')
        .trim()
        .toLowerCase() || 'none',
    handler: tooMany('for this account'),
    validate: { keyGeneratorIpFallback: false },
  });
  // Reset links and password changes: the same budget per address, counted on every request (each may mail).
  const perAddressAll = addressLimit(ctx.config.LOGIN_RATE_LIMIT * 5);

  r.post('/auth/sign-in', perAddress, perAccount, async (req, res) => {
    const input = parse(signInRequest, req.body);
    const { cookie } = await signIn({ db: ctx.db, auth: ctx.auth, input, address: req.ip ?? '' });
    res.append('Set-Cookie', cookie).status(204).end();
  });

  r.post('/auth/sign-out', async (req, res) => {
    const { cookie } = await signOut({ auth: ctx.auth, sessionId: req.sessionId });
    res.append('Set-Cookie', cookie).status(204).end();
  });

  r.post('/auth/sign-out-everywhere', requireUser, async (req, res) => {
    const actor = actorOf(req);
    const { cookie } = await signOutEverywhere({ db: ctx.db, auth: ctx.auth, userId: actor.id, shopId: actor.shopId });
    res.append('Set-Cookie', cookie).status(204).end();
  });

  r.post('/me/password', requireUser, perAddressAll, async (req, res) => {
    const input = parse(changePasswordRequest, req.body);
    const { cookie } = await changePassword({ db: ctx.db, auth: ctx.auth, userId: actorOf(req).id, input });
    res.append('Set-Cookie', cookie).status(204).end();
  });

  r.post('/auth/password-reset', perAddressAll, (req, res) => {
    const { email } = parse(passwordResetRequest, req.body);
    requestPasswordReset({ db: ctx.db, config: ctx.config, email });
    res.status(202).json({ detail: 'If the address has an account, a link to choose a new password is on its way.' });
  });

  r.post('/auth/password-reset/confirm', perAddressAll, async (req, res) => {
    const input = parse(passwordResetConfirm, req.body);
    const { cookie } = await confirmPasswordReset({ db: ctx.db, auth: ctx.auth, input });
    res.append('Set-Cookie', cookie).status(204).end();
  });

  r.get('/me', requireUser, async (req, res) => {
    res.json(meResponse.parse(await getMe({ db: ctx.db, userId: actorOf(req).id })));
  });
  r.get('/auth/session', async (req, res) => {
    const user = req.actor ? await getMe({ db: ctx.db, userId: req.actor.id }) : null;
    res.json(sessionResponse.parse({ user }));
  });
  return r;
}
