// Sign-in limits count failures only; sessions end after the shop's idle and absolute lifetimes; API answers
// are not kept by browsers, and pictures are revalidated so a signed-out browser cannot show them.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessions, shops } from '../src/db/schema';
import type { RunningServer } from '../src/server';
import { createShop, createUser } from '../src/testing/factories';
import { Client, startTestServer } from './harness';
import { TINY_PNG } from './pictures';

let server: RunningServer;
const PASSWORD = 'relay-coil-bench-5';

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

const sessionIdOf = (c: Client) => c.cookie.split('=')[1]!;

describe('sign-in limits', () => {
  // Its own server: 3 failures per account, 15 per address, counted from zero.
  let limited: RunningServer;
  beforeAll(async () => {
    limited = await startTestServer({ LOGIN_RATE_LIMIT: '3' });
  });
  afterAll(() => limited.close());

  it('ten successful sign-ins in a row lock nobody out', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', password: PASSWORD });
    for (let i = 0; i < 10; i++) await new Client(limited.url).signIn(user.email, PASSWORD);
  });

  it('failures on one account lock that account, not others', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', password: PASSWORD });
    const other = await createUser(server.ctx.db, { shopId: 'shop-demo', password: PASSWORD });
    const c = new Client(limited.url);
    for (let i = 0; i < 3; i++) expect((await c.post('/api/auth/sign-in', { email: user.email, password: 'wrong-one' })).status).toBe(401);
    const locked = await c.post('/api/auth/sign-in', { email: user.email, password: PASSWORD });
    expect(locked.status).toBe(429);
    expect(String(locked.body.detail)).toMatch(/failed sign-in attempts for this account/);
    await new Client(limited.url).signIn(other.email, PASSWORD);
  });

  it('failures from one address across accounts hit the per-address limit', async () => {
    // 3 × 5 = 15 failures per address; the earlier test spent 3 (and the 429 counts as one more).
    const c = new Client(limited.url);
    let last = 0;
    for (let i = 0; i < 12; i++) last = (await c.post('/api/auth/sign-in', { email: `nobody-${i}@limits.test`, password: 'x' })).status;
    expect(last).toBe(429);
  });
});

describe('caching', () => {
  it('answers the API with no-store', async () => {
    const c = await new Client(server.url).signIn('tech@demo.test');
    for (const path of ['/api/me', '/api/jobs', '/api/auth/session']) expect((await c.get(path)).headers.get('cache-control')).toBe('no-store');
  });

  it('revalidates pictures, and a signed-out browser revalidating gets 401', async () => {
    const c = await new Client(server.url).signIn('tech@demo.test');
    const png = TINY_PNG;
    const up = await fetch(`${server.url}/api/uploads`, { method: 'POST', headers: { cookie: c.cookie, 'content-type': 'image/png' }, body: png });
    const { url } = (await up.json()) as { url: string };
    const first = await fetch(server.url + url, { headers: { cookie: c.cookie } });
    expect(first.headers.get('cache-control')).toBe('private, no-cache');
    const etag = first.headers.get('etag')!;
    expect(etag).toBeTruthy();
    // What a browser sends when it revalidates its copy (fetch would add "no-cache" to a conditional request).
    const revalidate = (cookie: string) => fetch(server.url + url, { headers: { cookie, 'if-none-match': etag, 'cache-control': 'max-age=0' } });
    expect((await revalidate(c.cookie)).status).toBe(304);
    const cookie = c.cookie;
    await c.post('/api/auth/sign-out');
    expect((await revalidate(cookie)).status).toBe(401);
  });
});

describe('session lifetime', () => {
  it('the cookie lasts the shop’s absolute lifetime (30 days by default), not 400 days', async () => {
    const res = await fetch(server.url + '/api/auth/sign-in', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'trainee@demo.test', password: 'splitscope-demo' }),
    });
    expect(res.headers.get('set-cookie')).toMatch(/Max-Age=2592000/);
  });

  it('ends after 12 h without a request, and is moved on by use', async () => {
    const c = await new Client(server.url).signIn('lead@demo.test');
    const id = sessionIdOf(c);
    const [row] = await server.ctx.db.select().from(sessions).where(eq(sessions.id, id));
    expect(row!.expiresAt.getTime() - row!.createdAt.getTime()).toBeGreaterThan(11.9 * 3_600_000);
    expect(row!.expiresAt.getTime() - row!.createdAt.getTime()).toBeLessThanOrEqual(12 * 3_600_000 + 1000);
    // 5 h left: past half the idle time, so the next request moves the expiry to 12 h from now.
    await server.ctx.db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() + 5 * 3_600_000) })
      .where(eq(sessions.id, id));
    server.ctx.auth.forgetKept();
    expect((await c.get('/api/me')).status).toBe(200);
    const [moved] = await server.ctx.db.select().from(sessions).where(eq(sessions.id, id));
    expect(moved!.expiresAt.getTime()).toBeGreaterThan(Date.now() + 11.9 * 3_600_000);
    await server.ctx.db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(sessions.id, id));
    server.ctx.auth.forgetKept();
    expect((await c.get('/api/me')).status).toBe(401);
  });

  it('ends at the shop’s absolute lifetime however busy, and a shop can shorten it', async () => {
    const shop = await createShop(server.ctx.db, { name: 'Lifetime Test Shop' });
    const user = await createUser(server.ctx.db, { shopId: shop.id, role: 'admin', password: PASSWORD });
    const c = await new Client(server.url).signIn(user.email, PASSWORD);
    const id = sessionIdOf(c);
    await server.ctx.db
      .update(sessions)
      .set({ createdAt: new Date(Date.now() - 2 * 86_400_000) })
      .where(eq(sessions.id, id));
    server.ctx.auth.forgetKept();
    expect((await c.get('/api/me')).status).toBe(200);
    const r = await c.patch('/api/shop', { sessionMaxDays: 1 });
    expect(r.status).toBe(200);
    server.ctx.auth.forgetKept();
    expect((await c.get('/api/me')).status).toBe(401);
    await server.ctx.db.update(shops).set({ sessionMaxDays: 30 }).where(eq(shops.id, shop.id));
  });
});
