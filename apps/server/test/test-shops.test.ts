// Shops of the browser specs' own (testing/test-shops.ts): two shops see nothing of each other, and removing one
// leaves no row of it in any table (counted per table from the database's catalog) and nothing of the others gone.
// That the routes answer 404 outside a demo server with the local fakes is in the authorization matrix.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../src/server';
import { shopRowCounts } from '../src/testing/remove-shop';
import { readingRequest, type TestShop } from '../src/testing/requests';
import { Client, startTestServer } from './harness';
import { TINY_PNG } from './pictures';

let server: RunningServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

async function newShop(): Promise<TestShop> {
  const r = await new Client(server.url).post('/api/testing/shops');
  expect(r.status).toBe(201);
  return r.body as unknown as TestShop;
}

/** A customer, a job on the shop's outdoor board with a reading, a repair note's picture and a quote. */
async function fill(shop: TestShop) {
  const tech = await new Client(server.url).signIn(shop.users.tech.email);
  const customer = await tech.post('/api/customers', { name: `Isolation ${shop.id}`, kind: 'contractor' });
  expect(customer.status).toBe(201);
  const job = await tech.post('/api/jobs', {
    customerId: customer.body.id,
    boardId: shop.boards.outdoorFan,
    unitDescription: 'Outdoor unit',
    symptom: 'Fan never starts',
  });
  expect(job.status).toBe(201);
  const jobId = String(job.body.id);
  const reading = await tech.post(`/api/jobs/${jobId}/readings`, readingRequest({ mode: 'dcv', red: 'TP3', black: '0', power: 'on', value: 14.9 }));
  expect(reading.status).toBe(201);
  const upload = await fetch(`${server.url}/api/uploads?${new URLSearchParams({ jobId, name: 'board.png' })}`, {
    method: 'POST',
    headers: { cookie: tech.cookie, 'content-type': 'image/png' },
    body: TINY_PNG,
  });
  expect(upload.status).toBe(201);
  const quote = await tech.post(`/api/jobs/${jobId}/quotes`, { lines: [{ kind: 'labour', description: 'Bench time', quantity: '1', unitCents: 5000 }] });
  expect(quote.status).toBe(201);
  return { tech, jobId, customerId: String(customer.body.id) };
}

describe('test shops', () => {
  it('are made with one person per role and the demo boards, each with its expected table', async () => {
    const shop = await newShop();
    const admin = await new Client(server.url).signIn(shop.users.admin.email);
    const people = (await admin.get('/api/users')).body as unknown as { items: { role: string }[] };
    expect(people.items.map((p) => p.role).sort()).toEqual(['admin', 'lead', 'tech', 'trainee']);
    const boards = (await admin.get('/api/boards')).body as unknown as { items: { id: string }[] };
    expect(boards.items.map((b) => b.id).sort()).toEqual(Object.values(shop.boards).sort());
    const board = (await admin.get(`/api/boards/${shop.boards.indoorFan}`)).body as unknown as { expectedReadings: unknown[] };
    expect(board.expectedReadings.length).toBeGreaterThan(10);
    expect((await admin.request('DELETE', `/api/testing/shops/${shop.id}`)).status).toBe(200);
  });

  it('see nothing of each other, and removing one leaves no row of it and every row of the others', async () => {
    const [a, b] = [await newShop(), await newShop()];
    const inA = await fill(a);
    const inB = await fill(b);
    // B's people do not see A's customer, job or board, by list or by id.
    const jobs = (await inB.tech.get('/api/jobs')).body as unknown as { items: { id: string }[] };
    expect(jobs.items.map((j) => j.id)).toEqual([inB.jobId]);
    const customers = (await inB.tech.get('/api/customers')).body as unknown as { items: { id: string }[] };
    expect(customers.items.map((c) => c.id)).toEqual([inB.customerId]);
    expect((await inB.tech.get(`/api/jobs/${inA.jobId}`)).status).toBe(404);
    expect((await inB.tech.get(`/api/customers/${inA.customerId}`)).status).toBe(404);
    expect((await inB.tech.get(`/api/boards/${a.boards.outdoorFan}`)).status).toBe(404);

    const before = await shopRowCounts(server.ctx.db, a.id);
    for (const table of [
      'shops',
      'users',
      'sessions',
      'customers',
      'jobs',
      'readings',
      'uploads',
      'quotes',
      'quote_lines',
      'board_models',
      'board_model_versions',
    ])
      expect(before[table], `${table} rows of the shop before removal`).toBeGreaterThan(0);
    const othersBefore = { b: await shopRowCounts(server.ctx.db, b.id), demo: await shopRowCounts(server.ctx.db, 'shop-demo') };

    const removed = await new Client(server.url).request('DELETE', `/api/testing/shops/${a.id}`);
    expect(removed.status).toBe(200);
    expect(removed.body).toMatchObject({ jobs: 1, readings: 1, users: 4, shops: 1 });
    const after = await shopRowCounts(server.ctx.db, a.id);
    expect(Object.entries(after).filter(([, n]) => n > 0)).toEqual([]);
    expect(Object.keys(after).length, 'tables counted').toBeGreaterThan(30);
    expect(await shopRowCounts(server.ctx.db, b.id)).toEqual(othersBefore.b);
    expect(await shopRowCounts(server.ctx.db, 'shop-demo')).toEqual(othersBefore.demo);
    // A's people can no longer sign in; B's still work.
    await expect(new Client(server.url).signIn(a.users.tech.email)).rejects.toThrow(/401/);
    expect((await inB.tech.get(`/api/jobs/${inB.jobId}`)).status).toBe(200);
    expect((await new Client(server.url).request('DELETE', `/api/testing/shops/${b.id}`)).status).toBe(200);
  });

  it('removes only test shops: the demo shop is not one', async () => {
    const r = await new Client(server.url).request('DELETE', '/api/testing/shops/shop-demo');
    expect(r.status).toBe(404);
    expect((await shopRowCounts(server.ctx.db, 'shop-demo')).users).toBeGreaterThan(0);
  });
});
