import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { readings } from '../src/db/schema';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';
import { TINY_PNG, tinyJpeg } from './pictures';
import { dividerReading } from '../src/testing/requests';

let server: RunningServer;
let tech: Client;
let jobId: string;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Bench Test Contracting' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
});
afterAll(() => server.close());

const count = async () => (await server.ctx.db.select({ id: readings.id }).from(readings).where(eq(readings.jobId, jobId))).length;

describe('readings', () => {
  // 15 V over 10k/10k is 7.5 V; the default meter's 10 Mohm input (a typical DMM, from memory) loads the
  // lower 10k to 9.990k, so 15 * 9990 / 19990 = 7.496 V.
  it('stores a reading with the verdict from the pinned board model (divider of 15 V read by a 10 Mohm meter)', async () => {
    const r = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading());
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ redNet: 'mid', blackNet: '0', verdict: { verdict: 'ok', unit: 'V' } });
    expect(r.body.expected).toBeCloseTo(7.496, 3);
    const low = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 2.1, raw: '2.1' }));
    expect(low.body).toMatchObject({ verdict: { verdict: 'low' } });
  });

  it('a retried POST with the same key stores one row and answers the same body', async () => {
    const body = dividerReading({ value: 7.4, raw: '7.4' });
    const before = await count();
    const a = await tech.post(`/api/jobs/${jobId}/readings`, body);
    const b = await tech.post(`/api/jobs/${jobId}/readings`, body);
    expect(a.status).toBe(201);
    expect(b.status).toBe(201);
    expect(b.body).toEqual(a.body);
    expect(await count()).toBe(before + 1);
  });

  it('a correction keeps the history: the old row stays, marked superseded', async () => {
    const first = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 75, raw: '75' }));
    const fix = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 7.5, raw: '7.5', supersedes: String(first.body.id) }));
    expect(fix.status).toBe(201);
    const all = await tech.get(`/api/jobs/${jobId}/readings`);
    const old = (all.body.items as { id: string; supersededBy: string | null }[]).find((x) => x.id === first.body.id);
    expect(old?.supersededBy).toBe(fix.body.id);
    const current = await tech.get(`/api/jobs/${jobId}/readings?view=current`);
    expect((current.body.items as { id: string }[]).map((x) => x.id)).not.toContain(first.body.id);
  });

  it.each([
    ['dcv sent as unpowered', dividerReading({ power: 'off' }), 422, /powered/],
    ['"abc" as the value', { ...dividerReading(), value: 'abc' }, 422, /value/],
    [
      'Infinity (1e400 in JSON)',
      '{"idempotencyKey":"k-1e400-aaaa","mode":"dcv","red":"TP2","black":"0","power":"on","value":1e400,"raw":"x"}',
      422,
      /must be a number/,
    ],
    ['NaN', '{"idempotencyKey":"k-nan-aaaaaa","mode":"dcv","red":"TP2","black":"0","power":"on","value":NaN,"raw":"x"}', 400, /JSON/],
    ['a negative resistance', dividerReading({ mode: 'ohm', power: 'off', value: -5, raw: '-5' }), 422, /negative/],
    ['an unknown net', dividerReading({ red: 'TP99' }), 422, /TP99/],
  ])('refuses %s and stores nothing', async (_what, body, status, detail) => {
    const before = await count();
    const r = await tech.post(`/api/jobs/${jobId}/readings`, body);
    expect(r.status).toBe(status);
    expect(r.headers.get('content-type')).toMatch(/problem\+json/);
    expect(String(r.body.detail)).toMatch(detail);
    expect(await count()).toBe(before);
  });

  it('refuses a 10 MB body with 413', async () => {
    const before = await count();
    const r = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ raw: 'x'.repeat(10 * 1024 * 1024) }));
    expect(r.status).toBe(413);
    expect(await count()).toBe(before);
  });

  it('answers 404 for another shop and 403 for a trainee on a job not assigned to them', async () => {
    const other = await new Client(server.url).signIn('tech@other.test');
    expect((await other.post(`/api/jobs/${jobId}/readings`, dividerReading())).status).toBe(404);
    const trainee = await new Client(server.url).signIn('trainee@demo.test');
    expect((await trainee.post(`/api/jobs/${jobId}/readings`, dividerReading())).status).toBe(403);
  });

  it('runs the diagnosis on the current readings', async () => {
    const d = await tech.get(`/api/jobs/${jobId}/diagnosis`);
    expect(d.status).toBe(200);
    expect(d.body.engineVersion).toMatch(/diagnosis@/);
    expect((d.body.readings as unknown[]).length).toBeGreaterThan(0);
    expect((d.body.parts as { part: string }[]).map((p) => p.part)).toEqual(expect.arrayContaining(['R1']));
  });
});

describe('uploads', () => {
  const png = TINY_PNG;
  const send = (bytes: Buffer, type: string) =>
    fetch(`${server.url}/api/uploads?jobId=${jobId}`, { method: 'POST', headers: { cookie: tech.cookie, 'content-type': type }, body: bytes });

  it('accepts a PNG and a JPEG and serves them back with their type', async () => {
    for (const [bytes, type] of [
      [png, 'image/png'],
      [await tinyJpeg(), 'image/jpeg'],
    ] as const) {
      const r = await send(bytes, 'application/octet-stream');
      expect(r.status).toBe(201);
      const body = (await r.json()) as { url: string; contentType: string; size: number };
      expect(body).toMatchObject({ contentType: type, size: bytes.length });
      const back = await fetch(server.url + body.url, { headers: { cookie: tech.cookie } });
      expect(back.headers.get('content-type')).toContain(type);
      expect(Buffer.from(await back.arrayBuffer()).equals(bytes)).toBe(true);
    }
  });

  it('refuses a renamed text file, an SVG with script, and an oversize file', async () => {
    expect((await send(Buffer.from('just some notes, not a picture'), 'image/png')).status).toBe(415);
    expect((await send(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), 'image/svg+xml')).status).toBe(415);
    const big = Buffer.concat([png, Buffer.alloc(server.ctx.config.UPLOAD_MAX_BYTES + 1)]);
    expect((await send(big, 'image/png')).status).toBe(413);
  });
});
