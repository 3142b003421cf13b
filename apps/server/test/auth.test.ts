import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../src/server';
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

  it('refuses a state-changing request from another origin', async () => {
    const r = await new Client(server.url).post('/api/auth/sign-in', { email: 'a@b.test', password: 'x' }, { origin: 'https://evil.example' });
    expect(r.status).toBe(403);
  });
});
