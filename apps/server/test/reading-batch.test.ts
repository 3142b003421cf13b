// Readings posted at the same moment are stored by one statement (`write-batch.ts`). These requests are sent
// together so they land in the same batch, and each must get the answer it would get alone.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createReadingResponse } from '@splitscope/contract';
import { jobs, readings } from '../src/db/schema';
import { batchStats, insertReading } from '../src/features/readings/write-batch';
import { newId } from '../src/lib/ids';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';
import { dividerReading } from '../src/testing/requests';

let server: RunningServer;
let tech: Client;
let other: Client;
let boardId: string;
let customerId: string;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  customerId = (await createCustomer(db, { shopId: 'shop-demo', name: 'Batch Test Contracting' })).id;
  boardId = (await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  other = await new Client(server.url).signIn('tech@other.test');
});
afterAll(() => server.close());

const newJob = async () => (await createJob(server.ctx.db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId, boardId })).id;
const rowsOf = (jobId: string) => server.ctx.db.select().from(readings).where(eq(readings.jobId, jobId));
const statusOf = async (jobId: string) => (await server.ctx.db.select({ s: jobs.status }).from(jobs).where(eq(jobs.id, jobId)))[0]!.s;

describe('readings sent together', () => {
  // Deterministic, unlike counting statements behind concurrent HTTP requests (how many share a turn of the event
  // loop depends on the machine): rows handed to the writer in one turn go out as one statement.
  it('rows queued in the same turn of the event loop are stored by one statement', async () => {
    const jobId = await newJob();
    expect((await tech.post(`/api/jobs/${jobId}/readings`, dividerReading())).status).toBe(201);
    const [{ createdAt: _createdAt, ...stored }] = (await rowsOf(jobId)) as [typeof readings.$inferSelect];
    const rows = Array.from({ length: 40 }, () => ({ ...stored, id: newId(), idempotencyKey: randomUUID() }));
    const before = batchStats.statements;
    const written = await Promise.all(rows.map((r) => insertReading(server.ctx.db, r)));
    expect(batchStats.statements - before).toBe(1);
    expect(written.map((w) => w?.id)).toEqual(rows.map((r) => r.id));
    expect(await rowsOf(jobId)).toHaveLength(41);
  });

  it('are all stored, each answered with its own row, and the first moves a received job to diagnosing', async () => {
    const jobId = await newJob();
    expect(await statusOf(jobId)).toBe('received');
    const bodies = Array.from({ length: 40 }, (_, i) => dividerReading({ value: 7 + i / 100, raw: `${7 + i / 100}` }));
    const answers = await Promise.all(bodies.map((b) => tech.post(`/api/jobs/${jobId}/readings`, b)));
    expect(answers.map((a) => a.status)).toEqual(bodies.map(() => 201));
    // The route writes the answer without parsing it again: the contract must still accept every one.
    for (const a of answers) expect(createReadingResponse.safeParse(a.body).error).toBeUndefined();
    answers.forEach((a, i) =>
      expect(a.body).toMatchObject({
        idempotencyKey: bodies[i]!.idempotencyKey,
        value: bodies[i]!.value,
        authorName: expect.any(String),
        verdict: { unit: 'V' },
      }),
    );
    const rows = await rowsOf(jobId);
    expect(rows).toHaveLength(40);
    expect(new Set(rows.map((r) => r.idempotencyKey))).toEqual(new Set(bodies.map((b) => b.idempotencyKey)));
    expect(await statusOf(jobId)).toBe('diagnosing');
  });

  // Batches in flight at once may name the same received jobs; each first reading moves its job on.
  it('first readings of several received jobs, interleaved over concurrent batches, are all stored', async () => {
    const ids = await Promise.all(Array.from({ length: 6 }, () => newJob()));
    const sent = Array.from({ length: 150 }, (_, i) => ({ jobId: ids[(i * 7) % ids.length]!, body: dividerReading() }));
    const answers = await Promise.all(sent.map(({ jobId, body }) => tech.post(`/api/jobs/${jobId}/readings`, body)));
    expect(answers.filter((a) => a.status !== 201).map((a) => a.body)).toEqual([]);
    for (const id of ids) {
      expect(await rowsOf(id)).toHaveLength(25);
      expect(await statusOf(id)).toBe('diagnosing');
    }
  });

  it('a key sent twice in the same batch stores one row, and both answers are that row', async () => {
    const jobId = await newJob();
    const body = dividerReading();
    const [a, b] = await Promise.all([tech.post(`/api/jobs/${jobId}/readings`, body), tech.post(`/api/jobs/${jobId}/readings`, body)]);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(b.body.id).toBe(a.body.id);
    expect(await rowsOf(jobId)).toHaveLength(1);
  });

  it('a job closed to readings, another shop and a second correction of one reading are refused; the rest of the batch is stored', async () => {
    const open = await newJob();
    const closed = await newJob();
    await server.ctx.db.update(jobs).set({ status: 'awaiting-review' }).where(eq(jobs.id, closed));
    const first = await tech.post(`/api/jobs/${open}/readings`, dividerReading({ value: 75, raw: '75' }));
    const sent = await Promise.all([
      tech.post(`/api/jobs/${open}/readings`, dividerReading()),
      tech.post(`/api/jobs/${closed}/readings`, dividerReading()),
      other.post(`/api/jobs/${open}/readings`, dividerReading()),
      tech.post(`/api/jobs/${open}/readings`, dividerReading({ supersedes: String(first.body.id) })),
      tech.post(`/api/jobs/${open}/readings`, dividerReading({ supersedes: String(first.body.id) })),
      tech.post(`/api/jobs/${open}/readings`, dividerReading({ value: 7.4, raw: '7.4' })),
    ]);
    const [plain, toClosed, fromOther, fixA, fixB, plain2] = sent;
    expect(plain!.status).toBe(201);
    expect(plain2!.status).toBe(201);
    expect(toClosed!.status).toBe(409);
    expect(toClosed!.body.detail).toMatch(/this job is awaiting-review/);
    expect(fromOther!.status).toBe(404);
    // One of the two corrections wins; the other is told to correct the newer reading.
    expect([fixA!.status, fixB!.status].sort()).toEqual([201, 409]);
    expect(await rowsOf(closed)).toHaveLength(0);
    const rows = await rowsOf(open);
    expect(rows).toHaveLength(4);
    expect(rows.filter((r) => r.supersedes === first.body.id)).toHaveLength(1);
  });

  it('keeps lifted parts, OL, a continuity beep and the safety-gate voltage as sent', async () => {
    const jobId = await newJob();
    const [ohm, cont] = await Promise.all([
      tech.post(
        `/api/jobs/${jobId}/readings`,
        dividerReading({ mode: 'ohm', power: 'off', value: 'OL', raw: 'OL', lifted: ['R2'], safetyCheck: { unplugged: true, busVolts: 1.2 } }),
      ),
      tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ mode: 'continuity', power: 'off', value: 'OL', raw: 'no beep', beep: false })),
    ]);
    expect(ohm!.status).toBe(201);
    expect(ohm!.body).toMatchObject({ value: 'OL', lifted: ['R2'], safetyBusVolts: 1.2 });
    expect(cont!.status).toBe(201);
    expect(cont!.body).toMatchObject({ mode: 'continuity', beep: false, value: 'OL' });
    const stored = await rowsOf(jobId);
    expect(stored.find((r) => r.id === ohm!.body.id)).toMatchObject({ lifted: ['R2'], overLimit: true, value: null, safetyBusVolts: 1.2 });
  });
});
