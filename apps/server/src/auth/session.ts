import type { RequestHandler } from 'express';
import type { Auth } from './lucia';
import './guards';

/** Reads the session cookie on every request and sets `req.actor`; refreshes the cookie when lucia extends it. */
export function sessionMiddleware(auth: Auth): RequestHandler {
  return async (req, res, next) => {
    try {
      const sessionId = auth.readSessionCookie(req.headers.cookie ?? '');
      if (!sessionId) return next();
      const { session, user } = await auth.validateSession(sessionId);
      if (session?.fresh) res.append('Set-Cookie', auth.createSessionCookie(session.id).serialize());
      if (!session) {
        res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
        return next();
      }
      req.actor = { id: user.id, email: user.email, name: user.name, role: user.role, shopId: user.shopId };
      req.sessionId = session.id;
      next();
    } catch (err) {
      next(err);
    }
  };
}
