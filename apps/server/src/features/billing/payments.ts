import Stripe from 'stripe';
import type { Config } from '../../config';

const clients = new WeakMap<Config, Stripe>();

/**
 * The payment service client: the official SDK, pointed by configuration at the hosted service or at the
 * local fake (same code path; only host, port, protocol and keys differ).
 */
export function paymentsFor(config: Config): Stripe {
  let c = clients.get(config);
  if (!c) {
    c = new Stripe(config.PAYMENTS_SECRET_KEY, {
      host: config.PAYMENTS_HOST,
      port: config.PAYMENTS_PORT,
      protocol: config.PAYMENTS_PROTOCOL,
      maxNetworkRetries: config.PAYMENTS_PROTOCOL === 'http' ? 0 : 2,
      telemetry: false,
      timeout: 15_000,
    });
    clients.set(config, c);
  }
  return c;
}
