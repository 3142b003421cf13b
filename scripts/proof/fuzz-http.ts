// One fuzz payload sent to the server: signed as the payment service signs when the route is its webhook, carried
// as the query string on a GET.
import { createHmac } from 'node:crypto';
import type { Session } from './env';
import type { FuzzPayload } from './zod-arb';

export const WEBHOOK_SECRET = `whsec_fuzz_${process.pid}`;
/** A payment-service signature over the exact bytes (t=…,v1=HMAC-SHA256 of "t.payload"), as the webhook checks. */
export const signWebhook = (payload: string) => {
  const t = Math.floor(Date.now() / 1000);
  return `t=${t},v1=${createHmac('sha256', WEBHOOK_SECRET).update(`${t}.${payload}`).digest('hex')}`;
};

/** Ids of real rows for the body fields that name them, so payloads reach past "no such customer". */

export async function send(
  method: string,
  url: string,
  p: FuzzPayload & { bytes?: Buffer },
  session: Session | null,
  signed: boolean,
): Promise<{ status: number; body: string }> {
  const headers: Record<string, string> = {};
  if (signed) headers['stripe-signature'] = signWebhook(p.text);
  if (p.contentType) headers['content-type'] = p.contentType;
  if (p.contentEncoding) headers['content-encoding'] = p.contentEncoding;
  if (session) headers.cookie = session.cookie;
  try {
    // A GET carries its payload as the query string (the route parses req.query).
    const query = method === 'GET' ? queryOf(p.text) : '';
    const r = await fetch(url + query, { method, headers, body: method === 'GET' ? undefined : (p.bytes ?? p.text), signal: AbortSignal.timeout(60_000) });
    return { status: r.status, body: await r.text() };
  } catch {
    return { status: 0, body: '' }; // no answer at all counts with the server errors
  }
}

/** A JSON object payload as `?k=v&…` (nested values as JSON text); anything else as one raw parameter. */
function queryOf(text: string): string {
  let v: unknown;
  try {
    v = JSON.parse(text);
  } catch {
    return `?q=${encodeURIComponent(text)}`;
  }
  if (!v || typeof v !== 'object' || Array.isArray(v)) return `?q=${encodeURIComponent(String(text))}`;
  const params = new URLSearchParams();
  for (const [k, x] of Object.entries(v)) params.append(k, typeof x === 'string' ? x : JSON.stringify(x));
  return `?${params}`;
}
