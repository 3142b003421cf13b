import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../src/server';
import { createUser } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

describe('health and sign-in against PostgreSQL', () => {
  it('reports the database as reachable', async () => {
    const r = await new Client(server.url).get('/api/health');
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ status: 'ok', db: 'ok' });
  });

  it('signs in a demo user with an HttpOnly, SameSite=Lax session cookie and answers /api/me', async () => {
    const c = new Client(server.url);
    const res = await fetch(server.url + '/api/auth/sign-in', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'lead@demo.test', password: 'splitscope-demo' }),
    });
    expect(res.status).toBe(204);
    const cookie = res.headers.get('set-cookie') ?? '';
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain http on loopback
    c.cookie = cookie.split(';')[0]!;
    const me = await c.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({ email: 'lead@demo.test', role: 'lead', shopId: 'shop-demo' });
  });

  it('refuses a wrong password with problem+json and no session', async () => {
    const c = new Client(server.url);
    const r = await c.post('/api/auth/sign-in', { email: 'lead@demo.test', password: 'wrong' });
    expect(r.status).toBe(401);
    expect(r.headers.get('content-type')).toMatch(/application\/problem\+json/);
    expect(r.body).toMatchObject({ status: 401, code: 'unauthorized', detail: 'E-mail or password is wrong' });
    expect((await c.get('/api/me')).status).toBe(401);
  });

  it('signs out: the session no longer works', async () => {
    const c = await new Client(server.url).signIn('tech@demo.test');
    expect((await c.get('/api/me')).status).toBe(200);
    const old = c.cookie;
    expect((await c.post('/api/auth/sign-out')).status).toBe(204);
    c.cookie = old;
    expect((await c.get('/api/me')).status).toBe(401);
  });

  // Sessions are kept a few seconds per process (`auth/session-cache.ts`); a change made here must not wait.
  it('a role change applies to the next request of a session already signed in', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', role: 'tech', password: 'role-change-test' });
    const c = await new Client(server.url).signIn(user.email, 'role-change-test');
    expect((await c.get('/api/users/invitations')).status).toBe(403);
    const admin = await new Client(server.url).signIn('admin@demo.test');
    expect((await admin.patch(`/api/users/${user.id}`, { role: 'admin' })).status).toBe(200);
    expect((await c.get('/api/users/invitations')).status).toBe(200);
    expect((await admin.patch(`/api/users/${user.id}`, { role: 'trainee' })).status).toBe(200);
    expect((await c.get('/api/users/invitations')).status).toBe(403);
  });

  it('refuses a state-changing request from another origin', async () => {
    const r = await new Client(server.url).post('/api/auth/sign-in', { email: 'a@b.test', password: 'x' }, { origin: 'https://evil.example' });
    expect(r.status).toBe(403);
  });
});
