// A real shop: SPLITSCOPE_MODE=shop on an empty database. The first-run page creates the shop and its admin,
// once; the demo seed and its published password never exist there.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../src/config';
import { startServer, type RunningServer } from '../src/server';
import { Client, createEmptyDatabase, startTestServer } from './harness';

let server: RunningServer;
let empty: Awaited<ReturnType<typeof createEmptyDatabase>>;

const firstRun = (email = 'owner@northbench.test') => ({
  shop: {
    name: 'North Bench Electronics',
    address: '4 Kiln Yard, Eastport',
    phone: '555-0100',
    email: 'desk@northbench.test',
    taxNumber: 'TX-0042',
    currency: 'EUR',
  },
  admin: { name: 'Maren Holt', email, password: 'kiln-yard-bench-7' },
});

beforeAll(async () => {
  empty = await createEmptyDatabase(`splitscope_shopmode_${process.pid}`);
  server = await startTestServer({ DATABASE_URL: empty.url, SPLITSCOPE_MODE: 'shop' });
});
afterAll(async () => {
  await server?.close();
  await empty?.drop();
});

describe('shop mode', () => {
  it('starts with no shop and no demo users, and says the first-run page is open', async () => {
    const c = new Client(server.url);
    expect((await c.get('/api/setup')).body).toEqual({ mode: 'shop', needsSetup: true });
    expect((await c.post('/api/auth/sign-in', { email: 'admin@demo.test', password: 'splitscope-demo' })).status).toBe(401);
  });

  it('refuses a common or short admin password', async () => {
    const c = new Client(server.url);
    const common = await c.post('/api/setup', { ...firstRun(), admin: { ...firstRun().admin, password: 'qwertyuiop' } });
    expect(common.status).toBe(422);
    expect(String(common.body.detail)).toMatch(/commonly used/);
    expect((await c.post('/api/setup', { ...firstRun(), admin: { ...firstRun().admin, password: 'short' } })).status).toBe(422);
    expect((await c.get('/api/setup')).body).toMatchObject({ needsSetup: true });
  });

  it('creates the shop and its admin once, even when two forms arrive together', async () => {
    const a = new Client(server.url);
    const b = new Client(server.url);
    const [ra, rb] = await Promise.all([a.post('/api/setup', firstRun()), b.post('/api/setup', firstRun('second@northbench.test'))]);
    expect([ra.status, rb.status].sort()).toEqual([204, 409]);
    const winner = ra.status === 204 ? a : b;
    const me = await winner.get('/api/me');
    expect(me.body).toMatchObject({ role: 'admin', shopName: 'North Bench Electronics' });
    const shop = await winner.get('/api/shop');
    expect(shop.body).toMatchObject({
      name: 'North Bench Electronics',
      address: '4 Kiln Yard, Eastport',
      taxNumber: 'TX-0042',
      sessionIdleHours: 12,
      sessionMaxDays: 30,
    });
    expect((await winner.get('/api/billing/settings')).body).toMatchObject({ currency: 'eur' });
    expect((await winner.get('/api/users')).body.items).toHaveLength(1);
    // Closed for good: a third try is refused and the status says so.
    expect((await new Client(server.url).post('/api/setup', firstRun('third@northbench.test'))).status).toBe(409);
    expect((await new Client(server.url).get('/api/setup')).body).toEqual({ mode: 'shop', needsSetup: false });
  });

  it('does not start on a database that holds the demo shop', async () => {
    const config = loadConfig({ ...process.env, NODE_ENV: 'test', PORT: '0', SPLITSCOPE_MODE: 'shop' });
    await expect(startServer(config)).rejects.toThrow(/holds the demo shop/);
  });
});

describe('demo mode', () => {
  it('has no first-run page', async () => {
    const demo = await startTestServer();
    try {
      const c = new Client(demo.url);
      expect((await c.get('/api/setup')).body).toEqual({ mode: 'demo', needsSetup: false });
      expect((await c.post('/api/setup', firstRun('x@demo-first-run.test'))).status).toBe(404);
    } finally {
      await demo.close();
    }
  });
});
