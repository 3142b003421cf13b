import type { RequestHandler } from 'express';
import { isIP } from 'node:net';
import { sendProblem, AppError } from './errors';

const LOOPBACK_NAMES = new Set(['localhost', 'localhost.localdomain']);

/** The host name of a Host header value: `example.test:5180` → `example.test`, `[::1]:5180` → `::1`. */
export function hostNameOf(host: string): string {
  const h = host.trim().toLowerCase();
  if (h.startsWith('[')) return h.slice(1, h.indexOf(']') === -1 ? undefined : h.indexOf(']'));
  return h.replace(/:\d*$/, '').replace(/\.$/, '');
}

/**
 * DNS-rebinding guard: a page on another site whose name was pointed at this server's address sends its own
 * name in `Host`. Only the name in PUBLIC_URL, the server's own HOST when it is a name, loopback names and IP
 * literals (which no other site can be reached by) are answered.
 */
export function hostAllowList({ publicUrl, host }: { publicUrl?: string; host?: string }): RequestHandler {
  const names = new Set(LOOPBACK_NAMES);
  if (publicUrl) names.add(hostNameOf(new URL(publicUrl).host));
  if (host && !isIP(host) && host !== '0.0.0.0') names.add(host.toLowerCase());
  return (req, res, next) => {
    const name = hostNameOf(req.headers.host ?? '');
    if (name && (names.has(name) || name.endsWith('.localhost') || isIP(name))) return next();
    sendProblem(res, new AppError('bad_request', `This server does not answer for the host name "${name.slice(0, 100)}"; use ${publicUrl ?? 'its address'}`));
  };
}
