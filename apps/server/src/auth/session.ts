import type { RequestHandler } from 'express';
import type { Auth } from './lucia';
import './guards';

/** Reads the session cookie on every request and sets `req.actor`; clears the cookie of a session that ended. */
export function sessionMiddleware(auth: Auth): RequestHandler {
  return async (req, res, next) => {
    try {
      const sessionId = auth.readSessionCookie(req.headers.cookie ?? '');
      if (!sessionId) return next();
      const actor = await auth.validate(sessionId);
      if (!actor) {
        res.append('Set-Cookie', auth.blankCookie());
        return next();
      }
      req.actor = actor;
      req.sessionId = sessionId;
      next();
    } catch (err) {
      next(err);
    }
  };
}
