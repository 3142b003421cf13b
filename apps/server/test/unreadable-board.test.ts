// A stored board document the schema rejects even after the in-memory upgrade (here: a part kind no version of the
// schema knows, as a hand edit of the database or an older server could leave it). A job on that version still
// opens, reads as a board without a model (readings recorded on its test points, not judged) with the notice's
// reason, and a lead stores the corrected form in place of it; from then on the job's readings are judged.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { BoardDetail, JobDetail } from '@splitscope/contract';
import { boardModelVersions } from '../src/db/schema';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, DIVIDER_BOARD } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let lead: Client;
let boardId: string;
let versionId: string;
let jobId: string;
const key = `unreadable-${randomUUID().slice(0, 8)}`;
const good = { ...DIVIDER_BOARD, id: key, slug: key, name: `Unreadable test board ${key}` };

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customerId = (await createCustomer(db, { shopId: 'shop-demo', name: 'Unreadable Board Contracting' })).id;
  boardId = (await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin', document: good })).id;
  // The stored document goes bad before any job reads it: a part kind the schema does not know.
  const [v] = await db.select({ id: boardModelVersions.id }).from(boardModelVersions).where(eq(boardModelVersions.boardId, boardId));
  versionId = v!.id;
  const bad = { ...good, parts: [{ ...good.parts[0]!, kind: 'gizmo' }, good.parts[1]] };
  await db.update(boardModelVersions).set({ document: bad }).where(eq(boardModelVersions.id, versionId));
  tech = await new Client(server.url).signIn('tech@demo.test');
  lead = await new Client(server.url).signIn('lead@demo.test');
  const r = await tech.post('/api/jobs', { customerId, unitDescription: 'Wall unit, indoor', boardId, symptom: 'Fan never starts' });
  expect(r.status).toBe(201);
  jobId = (r.body as unknown as { id: string }).id;
}, 120_000);
afterAll(() => server.close());

const read = (red: string, value: number) =>
  tech.post(`/api/jobs/${jobId}/readings`, { idempotencyKey: randomUUID(), mode: 'dcv', red, black: 'gnd', power: 'on', value, raw: String(value) });

describe('a board version whose stored document cannot be read', () => {
  it('opens its job as a board without a model, with the schema complaint for the lead', async () => {
    const r = await tech.get(`/api/jobs/${jobId}`);
    expect(r.status).toBe(200);
    const { board } = r.body as unknown as JobDetail;
    expect(board.modelProblem?.message).toMatch(/document\.parts\.0\.kind/);
    expect([board.document.sections.length, board.document.parts.length, board.expectedReadings.length]).toEqual([0, 0, 0]);
    // The test points that still read are kept, so the technician probes the same points.
    expect(board.document.testPoints.map((t) => t.id)).toEqual(['TP1', 'TP2']);
  });

  it('records readings on its test points without a verdict, and ranks nothing from them', async () => {
    const r = await read('TP2', 2.1);
    expect(r.status).toBe(201);
    expect(r.body.verdict).toBeNull();
    expect((await read('TP7', 1)).status).toBe(422);
    const dx = await tech.get(`/api/jobs/${jobId}/diagnosis`);
    expect(dx.status).toBe(200);
  }, 90_000);

  it('is corrected in place by a lead only; the job then judges its readings; a readable version is never rewritten', async () => {
    const path = `/api/boards/versions/${versionId}/document`;
    expect((await tech.put(path, { document: good })).status).toBe(403);
    const wrongKey = await lead.put(path, { document: { ...good, id: 'another-board' } });
    expect(wrongKey.status).toBe(422);
    const fixed = await lead.put(path, { document: good });
    expect(fixed.status).toBe(200);
    const b = fixed.body as unknown as BoardDetail;
    expect(b.modelProblem).toBeNull();
    expect(b.versionId).toBe(versionId);
    expect(b.expectedReadings.length).toBeGreaterThan(0);

    const job = (await tech.get(`/api/jobs/${jobId}`)).body as unknown as JobDetail;
    expect(job.board.modelProblem).toBeNull();
    expect(job.board.document.parts.map((p) => p.designator)).toEqual(['R1', 'R2']);
    const judged = await read('TP2', 2.1);
    expect(judged.status).toBe(201);
    expect((judged.body.verdict as { verdict: string }).verdict).toBe('low');

    expect((await lead.put(path, { document: good })).status).toBe(409);
  });
});
