// Customers: add, edit, list their jobs, and merge a duplicate typed twice at the counter.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../src/server';
import { createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let lead: Client;
beforeAll(async () => {
  server = await startTestServer();
  lead = await new Client(server.url).signIn('lead@demo.test');
});
afterAll(() => server.close());

describe('customers', () => {
  it('merges a duplicate: its jobs move, empty fields are filled, the duplicate is gone', async () => {
    const keep = await lead.post('/api/customers', { name: 'Odile Farrow', company: 'Farrow Cooling', kind: 'contractor', notes: 'Pays on delivery.' });
    const dup = await lead.post('/api/customers', {
      name: 'O. Farrow',
      email: 'odile@farrow.test',
      phone: '555-0133',
      kind: 'contractor',
      notes: 'Prefers e-mail.',
    });
    expect([keep.status, dup.status]).toEqual([201, 201]);
    const keepId = String(keep.body.id);
    const dupId = String(dup.body.id);
    const base = { shopId: 'shop-demo', createdBy: 'user-tech', boardId: 'board-demo-ofd-220' };
    await createJob(server.ctx.db, { ...base, customerId: keepId });
    await createJob(server.ctx.db, { ...base, customerId: dupId });
    await createJob(server.ctx.db, { ...base, customerId: dupId });

    const merged = await lead.post(`/api/customers/${keepId}/merge`, { duplicateId: dupId });
    expect(merged.status).toBe(200);
    expect(merged.body).toMatchObject({
      customer: {
        id: keepId,
        name: 'Odile Farrow',
        company: 'Farrow Cooling',
        email: 'odile@farrow.test',
        phone: '555-0133',
        notes: 'Pays on delivery.\nPrefers e-mail.',
      },
      moved: { jobs: 2, quotes: 0, invoices: 0 },
    });
    expect((await lead.get(`/api/customers/${dupId}`)).status).toBe(404);
    const jobs = await lead.get(`/api/jobs?customerId=${keepId}`);
    expect(jobs.body.items).toHaveLength(3);
  });

  it('refuses to merge a customer into itself, or another shop’s customer', async () => {
    const a = await lead.post('/api/customers', { name: 'Single Row', kind: 'field-technician' });
    expect((await lead.post(`/api/customers/${String(a.body.id)}/merge`, { duplicateId: String(a.body.id) })).status).toBe(422);
    expect((await lead.post(`/api/customers/${String(a.body.id)}/merge`, { duplicateId: 'customer-other' })).status).toBe(404);
  });

  it('a technician adds but does not merge', async () => {
    const tech = await new Client(server.url).signIn('tech@demo.test');
    const a = await tech.post('/api/customers', { name: 'Bench Added', kind: 'contractor' });
    expect(a.status).toBe(201);
    expect((await tech.post(`/api/customers/${String(a.body.id)}/merge`, { duplicateId: 'customer-jun' })).status).toBe(403);
  });
});
