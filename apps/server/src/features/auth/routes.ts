import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import { meResponse, sessionResponse, signInRequest } from '@splitscope/contract';
import { actorOf, requireUser } from '../../auth/guards';
import { AppError, parse } from '../../http/errors';
import type { AppContext } from '../../context';
import { getMe, signIn, signOut } from './service';

export function authRoutes(ctx: AppContext): Router {
  const r = Router();
  const tooMany = (what: string) => () => {
    throw new AppError('rate_limited', `Too many sign-in attempts ${what}; wait a few minutes and try again`);
  };
  // Per address and per account: a stolen list of e-mails cannot be sprayed from one machine, and one account
  // cannot be guessed at from many.
  const perAddress = rateLimit({ windowMs: 15 * 60_000, limit: ctx.config.LOGIN_RATE_LIMIT * 5, handler: tooMany('from this address'), standardHeaders: 'draft-7', legacyHeaders: false });
  const perAccount = rateLimit({
    windowMs: 15 * 60_000,
    limit: ctx.config.LOGIN_RATE_LIMIT,
    keyGenerator: (req) => String((req.body as { email?: unknown })?.email ?? '').trim().toLowerCase() || 'none',
    handler: tooMany('for this account'),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    validate: { keyGeneratorIpFallback: false },
  });

  r.post('/auth/sign-in', perAddress, perAccount, async (req, res) => {
    const input = parse(signInRequest, req.body);
    const { cookie } = await signIn({ db: ctx.db, auth: ctx.auth, input, address: req.ip ?? '' });
    res.append('Set-Cookie', cookie).status(204).end();
  });

  r.post('/auth/sign-out', async (req, res) => {
    const { cookie } = await signOut({ auth: ctx.auth, sessionId: req.sessionId });
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
