import type { RequestHandler } from 'express';
import { AppError } from './errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request forgery guard: a state-changing request that carries an Origin must come from this
 * site (the request's own host, or PUBLIC_URL). Requests without an Origin are not from a browser form.
 */
export function originCheck(publicUrl?: string): RequestHandler {
  const allowed = publicUrl ? new URL(publicUrl).origin : null;
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    if (!origin) return next();
    const own = `${req.protocol}://${req.get('host')}`;
    if (origin === own || origin === allowed) return next();
    next(new AppError('forbidden', `Requests from ${origin} are not accepted`));
  };
}
