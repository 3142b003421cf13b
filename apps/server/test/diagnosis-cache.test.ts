// The diagnosis is kept per job while its current readings stay the same: a repeated GET does not run the
// engine again, and anything that changes what the engine reads (a new reading, a correction) changes the answer.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { Diagnosis } from '@splitscope/contract';
import { diagnosisPool } from '../src/features/diagnosis/pool';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';
import { dividerReading } from '../src/testing/requests';

let server: RunningServer;
let tech: Client;
let other: Client;
let jobId: string;
// How many times the engine ran since the last reset: a wrapper around the call to the diagnosis thread.
const runs = { count: 0, restore: () => {} };

const diagnosis = async () => {
  const r = await tech.get(`/api/jobs/${jobId}/diagnosis`);
  expect(r.status).toBe(200);
  return r;
};
const readingIds = (r: { body: unknown }) => (r.body as Diagnosis).readings.map((x) => x.readingId);

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Diagnosis Cache Contracting' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  other = await new Client(server.url).signIn('tech@other.test');
  expect((await tech.post(`/api/jobs/${jobId}/readings`, dividerReading())).status).toBe(201);
  await diagnosis();
  const pool = diagnosisPool();
  const original = pool.run;
  pool.run = function (this: typeof pool, ...args: Parameters<typeof original>) {
    runs.count++;
    return original.apply(this, args);
  };
  runs.restore = () => void (pool.run = original);
});
beforeEach(() => void (runs.count = 0));
afterAll(async () => {
  runs.restore();
  await server.close();
});

describe('diagnosis cache', () => {
  it('a repeated GET with no new reading answers the same body (and ETag) without running the engine again', async () => {
    const a = await diagnosis();
    const b = await diagnosis();
    expect(runs.count).toBe(0);
    expect(b.body).toEqual(a.body);
    expect(b.headers.get('etag')).toBe(a.headers.get('etag'));
    expect(b.headers.get('content-type')).toBe('application/json; charset=utf-8');
  });

  it('a new reading changes the answer, and concurrent GETs for it run the engine once', async () => {
    const before = readingIds(await diagnosis());
    const r = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 2.1, raw: '2.1' }));
    expect(r.status).toBe(201);
    const answers = await Promise.all(Array.from({ length: 5 }, () => diagnosis()));
    expect(runs.count).toBe(1);
    for (const a of answers) expect(readingIds(a)).toEqual([...before, r.body.id]);
  });

  it('a retried POST (same key) stores nothing, so the kept answer stands', async () => {
    const body = dividerReading({ value: 7.4, raw: '7.4' });
    const first = await tech.post(`/api/jobs/${jobId}/readings`, body);
    const ids = readingIds(await diagnosis());
    runs.count = 0;
    const retry = await tech.post(`/api/jobs/${jobId}/readings`, body);
    expect(retry.body).toEqual(first.body);
    expect(readingIds(await diagnosis())).toEqual(ids);
    expect(runs.count).toBe(0);
  });

  it('a correction changes the answer: the corrected reading leaves it, the correction joins it', async () => {
    const wrong = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 75, raw: '75' }));
    expect(readingIds(await diagnosis())).toContain(wrong.body.id);
    const fix = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 7.5, raw: '7.5', supersedes: String(wrong.body.id) }));
    expect(fix.status).toBe(201);
    const ids = readingIds(await diagnosis());
    expect(ids).not.toContain(wrong.body.id);
    expect(ids).toContain(fix.body.id);
  });

  it("another shop's job answers 404 while its diagnosis is kept", async () => {
    await diagnosis();
    const r = await other.get(`/api/jobs/${jobId}/diagnosis`);
    expect(r.status).toBe(404);
    expect(JSON.stringify(r.body)).not.toContain('readingId');
  });
});
