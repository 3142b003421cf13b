import rateLimit from 'express-rate-limit';
import { AppError } from './errors';

/** A per-address limit on a public route (each request may mail or hash a password): 429 as problem+json. */
export function addressLimit(limit: number, windowMs = 15 * 60_000) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: () => {
      throw new AppError('rate_limited', 'Too many attempts from this address; wait a few minutes and try again');
    },
  });
}
