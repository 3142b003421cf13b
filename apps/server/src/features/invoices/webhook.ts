import express, { Router } from 'express';
import type Stripe from 'stripe';
import type { AppContext } from '../../context';
import { AppError } from '../../http/errors';
import { applyPaymentEvent } from './service';
import { paymentsFor } from '../billing';

/**
 * The payment service's webhook. Mounted ahead of the JSON parser: the signature is over the raw bytes, so
 * the body must reach `constructEvent` untouched. A bad or missing signature is a 400 and changes nothing.
 */
export function paymentWebhookRoutes(ctx: AppContext): Router {
  const r = Router();
  r.post('/', express.raw({ type: 'application/json', limit: '512kb' }), async (req, res) => {
    const signature = req.get('stripe-signature');
    if (!signature || !Buffer.isBuffer(req.body)) throw new AppError('bad_request', 'Missing webhook signature or body');
    let event: Stripe.Event;
    try {
      event = paymentsFor(ctx.config).webhooks.constructEvent(req.body, signature, ctx.config.PAYMENTS_WEBHOOK_SECRET);
    } catch {
      throw new AppError('bad_request', 'The webhook signature does not verify');
    }
    // A signature proves who sent the bytes, not that they are an event: the fields every event has are checked
    // before any is stored (a signed `{}` or a completed checkout without its session is a 400, not a 500).
    const e = event as unknown as { id?: unknown; type?: unknown; created?: unknown; data?: { object?: unknown } };
    const wellFormed =
      typeof e.id === 'string' &&
      e.id.length > 0 &&
      e.id.length <= 255 &&
      typeof e.type === 'string' &&
      Number.isFinite(e.created) &&
      !!e.data &&
      typeof e.data.object === 'object' &&
      e.data.object !== null;
    if (!wellFormed) throw new AppError('bad_request', 'The webhook event lacks its id, type, time or object');
    const outcome = await applyPaymentEvent({ db: ctx.db, config: ctx.config, event });
    res.json({ received: true, outcome });
  });
  return r;
}
