// Holes a probe of the running server found: the webhook secret, the security headers and host names, input
// the database cannot store, numbers outside physical ranges, and a reused idempotency key.
import { request } from 'node:http';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../src/config';
import { eq } from 'drizzle-orm';
import { diagnosisSnapshots, readings } from '../src/db/schema';
import { createCustomer, createJob } from '../src/testing/factories';
import type { RunningServer } from '../src/server';
import { Client, startTestServer } from './harness';

const DB = { DATABASE_URL: 'postgres://u:p@127.0.0.1:1/db' };

describe('payment webhook secret (hole 1)', () => {
  it('refuses to start outside the local fakes without a real secret, naming the variable', () => {
    for (const env of [
      { ...DB, LOCAL_FAKES: '0', PAYMENTS_SECRET_KEY: 'sk_live_shop' },
      { ...DB, LOCAL_FAKES: '0', PAYMENTS_SECRET_KEY: 'sk_live_shop', PAYMENTS_WEBHOOK_SECRET: 'whsec_local_fake' },
      { ...DB, NODE_ENV: 'production', PAYMENTS_SECRET_KEY: 'sk_live_shop' },
    ]) {
      expect(() => loadConfig(env)).toThrow(ConfigError);
      expect(() => loadConfig(env)).toThrow(/PAYMENTS_WEBHOOK_SECRET/);
    }
    expect(() => loadConfig({ ...DB, LOCAL_FAKES: '0', PAYMENTS_WEBHOOK_SECRET: 'whsec_real' })).toThrow(/PAYMENTS_SECRET_KEY/);
    expect(loadConfig({ ...DB, LOCAL_FAKES: '0', PAYMENTS_SECRET_KEY: 'sk_live_shop', PAYMENTS_WEBHOOK_SECRET: 'whsec_real' }).PAYMENTS_WEBHOOK_SECRET).toBe(
      'whsec_real',
    );
  });

  it('makes a random secret per run with the local fakes', () => {
    const a = loadConfig({ ...DB, LOCAL_FAKES: '1' }).PAYMENTS_WEBHOOK_SECRET;
    const b = loadConfig({ ...DB, LOCAL_FAKES: '1' }).PAYMENTS_WEBHOOK_SECRET;
    expect(a).toMatch(/^whsec_[A-Za-z0-9_-]{40,}$/);
    expect(a).not.toBe(b);
  });
});

/** A GET with a chosen Host header (fetch does not let a caller set it). */
function getWithHost(url: string, host: string): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const req = request(url, { headers: { host } }, (res) => {
      let body = '';
      res.on('data', (c: Buffer) => (body += c.toString()));
      res.on('end', () => resolve({ status: res.statusCode!, body }));
    });
    req.on('error', reject);
    req.end();
  });
}

let server: RunningServer;
let tech: Client;
let admin: Client;
let jobId: string;

beforeAll(async () => {
  server = await startTestServer({ LOCAL_FAKES: '1' });
  tech = await new Client(server.url).signIn('tech@demo.test');
  admin = await new Client(server.url).signIn('admin@demo.test');
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Hardening Test Customer', kind: 'contractor' });
  jobId = (
    await createJob(db, {
      shopId: 'shop-demo',
      createdBy: 'user-tech',
      boardId: 'board-demo-ofd-220',
      customerId: customer.id,
      unitDescription: 'Outdoor unit',
      symptom: 'Fan never starts',
      assigneeId: 'user-tech',
    })
  ).id;
});
afterAll(() => server?.close());

describe('the webhook with the published secret (hole 1)', () => {
  it('refuses an event signed with the value printed in the repository', async () => {
    const payload = JSON.stringify({
      id: 'evt_forged',
      type: 'checkout.session.completed',
      created: 1,
      data: { object: { id: 'cs_x', metadata: { invoiceId: 'x' } } },
    });
    const signature = new Stripe('sk_test_local_fake').webhooks.generateTestHeaderString({ payload, secret: 'whsec_local_fake' });
    const r = await fetch(`${server.url}/api/webhooks/payments`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': signature },
      body: payload,
    });
    expect(r.status).toBe(400);
  });

  it('answers a correctly signed body that is not an event with 400, storing nothing', async () => {
    const signer = new Stripe('sk_test_local_fake');
    for (const payload of ['{}', '{"id":"evt_x","type":"checkout.session.completed","created":1}', '{"type":"x","created":1,"data":{"object":{}}}']) {
      const signature = signer.webhooks.generateTestHeaderString({ payload, secret: server.ctx.config.PAYMENTS_WEBHOOK_SECRET });
      const r = await fetch(`${server.url}/api/webhooks/payments`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'stripe-signature': signature },
        body: payload,
      });
      expect(r.status, payload).toBe(400);
    }
  });
});

describe('headers and host names (hole 8)', () => {
  it('sends no upgrade-insecure-requests and no HSTS over plain HTTP', async () => {
    const r = await fetch(`${server.url}/api/health`);
    expect(r.headers.get('content-security-policy')).not.toContain('upgrade-insecure-requests');
    expect(r.headers.get('strict-transport-security')).toBeNull();
  });

  it('sends both when the public address is https', async () => {
    const s = await startTestServer({ PUBLIC_URL: 'https://bench.shop.example.test' });
    try {
      const r = await fetch(`${s.url}/api/health`);
      expect(r.headers.get('content-security-policy')).toContain('upgrade-insecure-requests');
      expect(r.headers.get('strict-transport-security')).toMatch(/max-age=\d+/);
      expect((await getWithHost(`${s.url}/api/health`, 'bench.shop.example.test')).status).toBe(200);
      expect((await getWithHost(`${s.url}/api/health`, 'other.example.test')).status).toBe(400);
    } finally {
      await s.close();
    }
  });

  it('answers loopback names and IP literals, and refuses another host name (DNS rebinding)', async () => {
    const port = new URL(server.url).port;
    for (const host of [`127.0.0.1:${port}`, `localhost:${port}`, `[::1]:${port}`, `app.localhost:${port}`]) {
      expect((await getWithHost(`${server.url}/api/health`, host)).status, host).toBe(200);
    }
    const r = await getWithHost(`${server.url}/api/health`, `rebind.attacker.example:${port}`);
    expect(r.status).toBe(400);
    expect(r.body).toContain('does not answer for the host name');
  });
});

const reading = (over: Record<string, unknown> = {}) => ({
  idempotencyKey: crypto.randomUUID(),
  mode: 'dcv',
  red: 'TP2',
  black: '0',
  power: 'on',
  value: 15.1,
  raw: '15.1',
  ...over,
});

describe('input the database cannot store (hole 9)', () => {
  it('answers a NUL character anywhere with a 422 naming the field', async () => {
    const cases: [string, string, unknown][] = [
      ['POST', '/api/customers', { name: 'Ada\u0000', kind: 'contractor' }],
      ['POST', `/api/jobs/${jobId}/readings`, reading({ raw: '15\u0000' })],
      ['POST', `/api/jobs/${jobId}/quotes`, { lines: [{ kind: 'part', description: 'Opto\u0000', quantity: '1', unitCents: 100 }] }],
      ['PATCH', `/api/jobs/${jobId}`, { symptom: 'dead\u0000' }],
      ['GET', '/api/customers?q=%00', undefined],
      ['GET', '/api/jobs?q=a%00b', undefined],
    ];
    for (const [method, path, body] of cases) {
      const r = await tech.request(method, path, body);
      expect(r.status, `${method} ${path}`).toBe(422);
      expect(JSON.stringify(r.body)).toContain('NUL');
    }
  });

  it('refuses a tax rate over 100 %, totals past the money range and dates like year 0000', async () => {
    const big = { kind: 'part', description: 'Everything', quantity: '999999.99', unitCents: 100_000_000_000 };
    for (const [path, body] of [
      [`/api/jobs/${jobId}/quotes`, { lines: [{ kind: 'part', description: 'Fuse', quantity: '1', unitCents: 100 }], taxRate: '101' }],
      [`/api/jobs/${jobId}/quotes`, { lines: [big] }],
      [`/api/jobs/${jobId}/quotes`, { lines: Array.from({ length: 10 }, () => ({ ...big, quantity: '1000' })) }],
      [`/api/jobs/${jobId}/readings`, reading({ takenAt: '0000-01-01T00:00:00Z' })],
      [`/api/jobs/${jobId}/readings`, reading({ takenAt: '+275760-09-13T00:00:00Z' })],
    ] as const) {
      const r = await tech.post(path, body);
      expect(r.status, JSON.stringify(body).slice(0, 120)).toBe(422);
    }
    expect((await admin.patch('/api/billing/settings', { taxRate: '101' })).status).toBe(422);
    expect((await tech.patch(`/api/jobs/${jobId}`, { dueAt: '0000-06-01T00:00:00Z' })).status).toBe(422);
    expect((await tech.get('/api/boards/board-demo-ofd-220?version=99999999999')).status).toBe(422);
  });
});

describe('numbers within physical ranges (hole 3)', () => {
  it('refuses readings outside what a meter can show, per mode', async () => {
    for (const over of [
      { value: 1e308 },
      { value: 1001 },
      { value: -1001 },
      { mode: 'ohm', power: 'off', value: 2e9, raw: '2G' },
      { mode: 'ohm', power: 'off', value: -1, raw: '-1' },
    ]) {
      const r = await tech.post(`/api/jobs/${jobId}/readings`, reading(over));
      expect(r.status, JSON.stringify(over)).toBe(422);
      expect(JSON.stringify(r.body)).toMatch(/value/);
    }
    expect((await tech.post(`/api/jobs/${jobId}/readings`, reading({ value: -999.5 }))).status).toBe(201);
  });
});

describe('stored numbers out of range (hole 3)', () => {
  it('keeps every page of a job readable with a 1e308 reading and a snapshot holding nulls for numbers', async () => {
    const db = server.ctx.db;
    const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Stored Range Customer', kind: 'contractor' });
    const job = (
      await createJob(db, {
        shopId: 'shop-demo',
        createdBy: 'user-tech',
        boardId: 'board-demo-ofd-220',
        customerId: customer.id,
        unitDescription: 'Outdoor unit',
        symptom: 'Fan never starts',
        assigneeId: 'user-tech',
      })
    ).id;
    expect((await tech.post(`/api/jobs/${job}/readings`, reading())).status).toBe(201);
    // as stored before the bounds: a reading of 1e308 V, and a snapshot the engine wrote from it
    const [good] = await db.select().from(readings).where(eq(readings.jobId, job));
    await db.insert(readings).values({ ...good!, id: crypto.randomUUID(), idempotencyKey: crypto.randomUUID(), requestHash: null, value: 1e308, raw: '1e308' });
    const output = {
      jobId: job,
      boardVersionId: good!.jobId,
      engineVersion: 'old',
      readings: [],
      candidates: [{ faults: [{ part: 'Q1', mode: 'open' }], probability: null, evidence: [] }],
      parts: [{ part: 'Q1', mode: 'open', probability: 0.5 }],
      restProbability: null,
      minimalDiagnoses: [['Q1']],
      nextTests: [],
      entropy: null,
    };
    await db
      .insert(diagnosisSnapshots)
      .values({ id: crypto.randomUUID(), shopId: 'shop-demo', jobId: job, engineVersion: 'old', proposedPart: 'Q1', output, createdBy: 'user-tech' });

    const diagnosis = await tech.get(`/api/jobs/${job}/diagnosis`);
    expect(diagnosis.status).toBe(200);
    expect((diagnosis.body as unknown as { readings: unknown[] }).readings).toHaveLength(1);
    const snaps = await tech.get(`/api/jobs/${job}/diagnosis-snapshots`);
    expect(snaps.status).toBe(200);
    const [snap] = (snaps.body as unknown as { items: { unreadable?: string[]; output: { parts: unknown[]; candidates: unknown[] } }[] }).items;
    expect(snap!.unreadable).toEqual(['1 of 1 candidates', 'restProbability', 'entropy']);
    expect(snap!.output.parts).toHaveLength(1);
    for (const path of [`/api/jobs/${job}`, `/api/jobs/${job}/readings`, '/api/jobs']) expect((await tech.get(path)).status, path).toBe(200);
  });
});

describe('a reused idempotency key (hole 12)', () => {
  it('answers the stored reading for the same body and 409 for a different one', async () => {
    const first = reading();
    const stored = await tech.post(`/api/jobs/${jobId}/readings`, first);
    expect(stored.status).toBe(201);
    const retry = await tech.post(`/api/jobs/${jobId}/readings`, first);
    expect(retry.status).toBe(201);
    expect(retry.body.id).toBe(stored.body.id);
    const other = await tech.post(`/api/jobs/${jobId}/readings`, { ...first, value: 14.2, raw: '14.2' });
    expect(other.status).toBe(409);
    expect(JSON.stringify(other.body)).toContain('key reused with a different reading');
  });

  it('tells two different readings sent at once under one key apart (the batched writer)', async () => {
    const key = crypto.randomUUID();
    const [a, b] = await Promise.all([
      tech.post(`/api/jobs/${jobId}/readings`, reading({ idempotencyKey: key, value: 15.0, raw: '15.0' })),
      tech.post(`/api/jobs/${jobId}/readings`, reading({ idempotencyKey: key, value: 3.3, raw: '3.3' })),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
  });
});
