// The local stand-in for the hosted payment service: an Express app that speaks the few endpoints of the
// payments API the server uses through the official `stripe` SDK (checkout sessions), serves a tiny hosted
// checkout page with a "Pay" button, and on payment sends the signed `checkout.session.completed` webhook
// back to the server, signed with the SDK's own test-header helper so the server verifies it exactly as it
// would a real one.
import express, { type NextFunction, type Request, type Response } from 'express';
import { randomBytes } from 'node:crypto';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';

export interface FakeSession {
  id: string;
  object: 'checkout.session';
  mode: 'payment';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_subtotal: number;
  amount_total: number;
  currency: string;
  client_reference_id: string | null;
  customer_email: string | null;
  metadata: Record<string, string>;
  success_url: string;
  cancel_url: string | null;
  url: string | null;
  payment_intent: string | null;
  created: number;
  expires_at: number;
  livemode: false;
  line_items: { name: string; unit_amount: number; quantity: number }[];
}

export interface WebhookDelivery {
  eventId: string;
  url: string;
  status: number;
  payload: string;
  signature: string;
}

export interface FakePayments {
  host: string;
  port: number;
  url: string;
  sessions: Map<string, FakeSession>;
  deliveries: WebhookDelivery[];
  setWebhookUrl(url: string): void;
  close(): Promise<void>;
}

interface Options {
  host?: string;
  port?: number;
  /** the secret key the server's SDK must present */
  secretKey: string;
  /** the webhook signing secret shared with the server */
  webhookSecret: string;
  /** where `checkout.session.completed` goes; can be set later (the server's port may not be known yet) */
  webhookUrl?: string;
}

const stripeError = (res: Response, status: number, type: string, message: string) => res.status(status).json({ error: { type, message } });

const newId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function nonNegativeInt(v: unknown): number | null {
  return typeof v === 'string' && /^\d{1,12}$/.test(v) ? Number(v) : null;
}

export async function startFakePayments(opts: Options): Promise<FakePayments> {
  const host = opts.host ?? '127.0.0.1';
  const sessions = new Map<string, FakeSession>();
  const events = new Map<string, object>();
  const deliveries: WebhookDelivery[] = [];
  let webhookUrl = opts.webhookUrl ?? null;
  let base = '';
  const signer = new Stripe(opts.secretKey, { telemetry: false });

  async function deliver(event: { id: string }): Promise<WebhookDelivery> {
    if (!webhookUrl) throw new Error('the fake payment service has no webhook URL');
    const payload = JSON.stringify(event, null, 2);
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: opts.webhookSecret });
    let status: number;
    try {
      const r = await fetch(webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signature }, body: payload });
      status = r.status;
      await r.arrayBuffer();
    } catch {
      status = 0; // the server is down; a real provider would retry later
    }
    const d = { eventId: event.id, url: webhookUrl, status, payload, signature };
    deliveries.push(d);
    return d;
  }

  const app = express();
  app.disable('x-powered-by');

  const api = express.Router();
  api.use((req: Request, res: Response, next: NextFunction) => {
    const auth = req.get('authorization') ?? '';
    if (auth !== `Bearer ${opts.secretKey}`) return stripeError(res, 401, 'invalid_request_error', 'Invalid API Key provided.');
    next();
  });
  api.use(express.urlencoded({ extended: true, limit: '100kb' }));

  api.post('/checkout/sessions', (req, res) => {
    const b = (req.body ?? {}) as Record<string, unknown>;
    if (b.mode !== 'payment') return stripeError(res, 400, 'invalid_request_error', 'Only mode=payment is supported here.');
    if (typeof b.success_url !== 'string') return stripeError(res, 400, 'invalid_request_error', 'Missing required param: success_url.');
    const items = Array.isArray(b.line_items) ? (b.line_items as Record<string, Record<string, unknown>>[]) : [];
    if (!items.length) return stripeError(res, 400, 'invalid_request_error', 'Missing required param: line_items.');
    const lines: FakeSession['line_items'] = [];
    let currency: string | null = null;
    for (const item of items) {
      const pd = item.price_data as Record<string, unknown> | undefined;
      const unit = nonNegativeInt(pd?.unit_amount);
      const qty = nonNegativeInt(item.quantity);
      const cur = typeof pd?.currency === 'string' ? pd.currency.toLowerCase() : null;
      const name = (pd?.product_data as Record<string, unknown> | undefined)?.name;
      if (unit === null || !qty || !cur || typeof name !== 'string')
        return stripeError(res, 400, 'invalid_request_error', 'Each line item needs price_data[currency, unit_amount, product_data[name]] and a quantity.');
      if (currency && cur !== currency) return stripeError(res, 400, 'invalid_request_error', 'All line items must use one currency.');
      currency = cur;
      lines.push({ name, unit_amount: unit, quantity: qty });
    }
    const total = lines.reduce((s, l) => s + l.unit_amount * l.quantity, 0);
    const id = newId('cs');
    const now = Math.floor(Date.now() / 1000);
    const session: FakeSession = {
      id,
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_subtotal: total,
      amount_total: total,
      currency: currency!,
      client_reference_id: typeof b.client_reference_id === 'string' ? b.client_reference_id : null,
      customer_email: typeof b.customer_email === 'string' ? b.customer_email : null,
      metadata: Object.fromEntries(Object.entries((b.metadata as Record<string, unknown>) ?? {}).map(([k, v]) => [k, String(v)])),
      success_url: b.success_url,
      cancel_url: typeof b.cancel_url === 'string' ? b.cancel_url : null,
      url: `${base}/checkout/${id}`,
      payment_intent: null,
      created: now,
      expires_at: now + 24 * 3600,
      livemode: false,
      line_items: lines,
    };
    sessions.set(id, session);
    res.json(session);
  });

  api.get('/checkout/sessions/:id', (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) return stripeError(res, 404, 'invalid_request_error', `No such checkout.session: '${req.params.id}'`);
    res.json(s);
  });

  api.get('/events/:id', (req, res) => {
    const e = events.get(req.params.id);
    if (!e) return stripeError(res, 404, 'invalid_request_error', `No such event: '${req.params.id}'`);
    res.json(e);
  });

  api.use((req, res) => stripeError(res, 404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${req.originalUrl}).`));
  app.use('/v1', api);

  // The hosted checkout page the customer is sent to.
  app.get('/checkout/:id', (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) return res.status(404).type('text/plain').send('This checkout does not exist.');
    const amount = `${s.currency.toUpperCase()} ${Math.trunc(s.amount_total / 100)}.${String(s.amount_total % 100).padStart(2, '0')}`;
    const rows = s.line_items.map((l) => `<li>${escapeHtml(l.name)} × ${l.quantity}</li>`).join('');
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Checkout (local test payments)</title>
<meta name="viewport" content="width=device-width, initial-scale=1"></head>
<body style="font-family: system-ui, sans-serif; max-width: 28rem; margin: 3rem auto; padding: 0 1rem">
<p style="background:#fff3cd;padding:.5rem">Local test payment service: no money moves.</p>
<h1>Pay ${escapeHtml(amount)}</h1><ul>${rows}</ul>
${
  s.status === 'open'
    ? `<form method="post" action="/checkout/${s.id}/pay"><button type="submit" style="font-size:1.2rem;padding:.6rem 1.4rem">Pay ${escapeHtml(amount)}</button></form>`
    : '<p>This checkout is already paid.</p>'
}
${s.cancel_url ? `<p><a href="${escapeHtml(s.cancel_url)}">Cancel and go back</a></p>` : ''}
</body></html>`);
  });

  app.post('/checkout/:id/pay', async (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) return res.status(404).type('text/plain').send('This checkout does not exist.');
    if (s.status === 'open') {
      s.status = 'complete';
      s.payment_status = 'paid';
      s.payment_intent = newId('pi');
      s.url = null;
      const event = {
        id: newId('evt'),
        object: 'event',
        type: 'checkout.session.completed',
        api_version: null,
        created: Math.floor(Date.now() / 1000),
        livemode: false,
        pending_webhooks: 1,
        request: { id: null, idempotency_key: null },
        data: { object: { ...s, line_items: undefined } },
      };
      events.set(event.id, event);
      await deliver(event);
    }
    res.redirect(303, s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
  });

  // Redelivery, as a provider does when it did not see a 2xx in time (and as its dashboard's "resend" does):
  // the same event, signed afresh.
  app.post('/_fake/events/:id/redeliver', async (req, res) => {
    const e = events.get(req.params.id);
    if (!e) return stripeError(res, 404, 'invalid_request_error', `No such event: '${req.params.id}'`);
    res.json(await deliver(e as { id: string }));
  });

  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(opts.port ?? 0, host, () => resolve(s));
    s.once('error', reject);
  });
  const port = (server.address() as AddressInfo).port;
  base = `http://${host}:${port}`;
  return {
    host,
    port,
    url: base,
    sessions,
    deliveries,
    setWebhookUrl: (url) => {
      webhookUrl = url;
    },
    close: () =>
      new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      }),
  };
}
