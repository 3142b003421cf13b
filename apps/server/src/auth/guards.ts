import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { Role } from '@splitscope/contract';
import { AppError } from '../http/errors';

export interface Actor {
  id: string;
  email: string;
  name: string;
  role: Role;
  shopId: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      actor?: Actor;
      sessionId?: string;
    }
  }
}

/** The signed-in user of a request that passed `requireUser`. */
export function actorOf(req: Request): Actor {
  if (!req.actor) throw new AppError('unauthorized', 'Sign in first');
  return req.actor;
}

export const requireUser: RequestHandler = (req: Request, _res: Response, next: NextFunction) => {
  if (!req.actor) return next(new AppError('unauthorized', 'Sign in first'));
  next();
};

/** The one place role checks live: routes list the roles they admit. */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.actor) return next(new AppError('unauthorized', 'Sign in first'));
    if (!allowed.includes(req.actor.role)) {
      return next(new AppError('forbidden', `This needs the role ${allowed.join(' or ')}; you are signed in as ${req.actor.role}`));
    }
    next();
  };
}

/**
 * For checks that depend on the request's content (which status a PATCH moves to): the same rule as
 * `requireRole`, called from a service once it knows what is asked.
 */
export function assertRole(actor: Actor, allowed: readonly Role[], what: string): void {
  if (!allowed.includes(actor.role)) {
    throw new AppError('forbidden', `${what} needs the role ${allowed.join(' or ')}; you are signed in as ${actor.role}`);
  }
}

/** Roles by what they may do live in the contract's policy, where the web reads them too. */
export { ROLES } from '@splitscope/contract';
