// A board version's fault dictionary is built once on publish, in a worker thread, and kept in PostgreSQL: a
// process that starts later (a restart, a second server) reads it instead of simulating, and its predictions are
// the engine's own (packages/diagnosis/test/dictionary.test.ts checks them against full solves).
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { attachDictionary, type CaseReading } from '@splitscope/diagnosis';
import type { BoardDetail, Diagnosis } from '@splitscope/contract';
import { faultDictionaries, faultDictionaryRows } from '../src/db/schema';
import { buildBoardEngine } from '../src/features/boards/engine';
import { DICTIONARY_ENGINE, enableDictionaryBuilds, ensureDictionary, readStoredDictionary } from '../src/features/diagnosis/dictionary';
import type { RunningServer } from '../src/server';
import { createCustomer, createJob, DIVIDER_BOARD } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let admin: Client;
let tech: Client;
let board: BoardDetail;

const readings: CaseReading[] = [
  { mode: 'dcv', red: 'mid', black: '0', power: 'on', value: 14.9 },
  { mode: 'ohm', red: 'mid', black: '0', power: 'off', value: 'OL' },
];

beforeAll(async () => {
  server = await startTestServer();
  // Test servers build no dictionaries unless asked (server.ts); this file asks.
  enableDictionaryBuilds(true);
  admin = await new Client(server.url).signIn('admin@demo.test');
  tech = await new Client(server.url).signIn('tech@demo.test');
  const key = `dict-${randomUUID().slice(0, 8)}`;
  const created = await admin.post('/api/boards', { document: { ...DIVIDER_BOARD, id: key, slug: key, name: `Dictionary ${key}` } });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  board = created.body as unknown as BoardDetail;
  // Publishing queued the build; it is ready when its row says so.
  for (let i = 0; i < 600; i++) {
    const [row] = await server.ctx.db
      .select()
      .from(faultDictionaries)
      .where(and(eq(faultDictionaries.versionId, board.versionId), eq(faultDictionaries.engineVersion, DICTIONARY_ENGINE)));
    if (row?.state === 'ready' || row?.state === 'failed') break;
    await new Promise((r) => setTimeout(r, 200));
  }
}, 180_000);
afterAll(async () => {
  enableDictionaryBuilds(false);
  await server.close();
});

describe('fault dictionary in PostgreSQL', () => {
  it('is stored on publish: one row per test, float64 predictions per fault column, with the engine version', async () => {
    const db = server.ctx.db;
    const [head] = await db.select().from(faultDictionaries).where(eq(faultDictionaries.versionId, board.versionId));
    expect(head).toMatchObject({ state: 'ready', engineVersion: DICTIONARY_ENGINE });
    expect(head!.partsDone).toBe(head!.partsTotal);
    const rows = await db.select().from(faultDictionaryRows).where(eq(faultDictionaryRows.versionId, board.versionId));
    const faults = head!.faults as string[];
    expect(faults[0]).toBe('∅');
    expect(rows.length).toBeGreaterThan(4);
    for (const r of rows) expect(r.predictions.byteLength).toBe(faults.length * 8);
    // Already ready: another process's claim builds nothing again.
    await ensureDictionary(db, board.versionId, { force: true });
    const [again] = await db.select().from(faultDictionaries).where(eq(faultDictionaries.versionId, board.versionId));
    expect(again!.updatedAt).toEqual(head!.updatedAt);
  });

  it('a process that starts later reads it from the database instead of simulating any fault', async () => {
    const stored = await readStoredDictionary(server.ctx.db, board.versionId);
    expect(stored).toBeDefined();
    // A fresh engine, as a restarted process builds it from the stored document.
    const engine = buildBoardEngine(`fresh-${randomUUID()}`, board.document);
    attachDictionary(engine.diagnoser, stored!.dictionary, stored!.pairs);
    const predict = vi.spyOn(engine.diagnoser.model, 'predict');
    const out = engine.diagnoser.update(readings);
    expect(predict.mock.calls.filter(([faults]) => faults.length > 0)).toEqual([]);
    expect(out.candidates.length).toBeGreaterThan(1);
  });

  it('the diagnosis route answers from the dictionary and lists what is still being checked', async () => {
    const customer = await createCustomer(server.ctx.db, { shopId: 'shop-demo', name: `Dictionary Cooling ${randomUUID().slice(0, 6)}` });
    const job = await createJob(server.ctx.db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id });
    for (const r of readings) {
      const res = await tech.post(`/api/jobs/${job.id}/readings`, { idempotencyKey: randomUUID(), ...r, raw: String(r.value) });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const first = (await tech.get(`/api/jobs/${job.id}/diagnosis`)).body as unknown as Diagnosis;
    expect(first.preparing).toBeUndefined();
    // Pairs the readings call for arrive from the background; the ranking then has none left to check.
    let d = first;
    for (let i = 0; i < 100 && d.checking; i++) {
      await new Promise((r) => setTimeout(r, 200));
      d = (await tech.get(`/api/jobs/${job.id}/diagnosis`)).body as unknown as Diagnosis;
    }
    expect(d.checking).toBeUndefined();
    expect(d.candidates.some((c) => c.checking)).toBe(false);
  }, 60_000);
});
