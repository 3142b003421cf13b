// Known-good references of a board model: a technician records good boards, a lead promotes a signed-off repair's
// verification readings; each point's band is shown from its three labelled sources, and a point where the model
// and the good boards disagree by more than either band is flagged for review in words. A shop of its own.
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardReferences } from '@splitscope/contract';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import { jobs, repairActions } from '../src/db/schema';
import { newId } from '../src/lib/ids';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob, createShop, createUser } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let lead: Client;
let shopId: string;
let boardId: string;
let techId: string;
let customerId: string;

const goodBoard = (serial: string, rail: number) => ({
  serial,
  readings: [
    { mode: 'dcv', red: 'TP3', black: 'gnd', power: 'on', value: 14.95 },
    { mode: 'dcv', red: 'TP5', black: 'gnd', power: 'on', value: 14.7 },
    // The speed command of these boards idles near 2.4 V (invented): the model's value is checked against it.
    { mode: 'dcv', red: 'TP9', black: 'gnd', power: 'on', value: rail },
  ],
});
const bandOf = (r: BoardReferences, point: string) => r.bands.find((b) => b.red === point && b.mode === 'dcv' && b.power === 'on');

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  shopId = (await createShop(db, { id: `shop-refs-${randomUUID().slice(0, 8)}`, name: 'References Test Bench' })).id;
  const suffix = randomUUID().slice(0, 8);
  techId = (await createUser(db, { shopId, role: 'tech', email: `tech-${suffix}@refs.test`, password: 'splitscope-demo' })).id;
  await createUser(db, { shopId, role: 'lead', email: `lead-${suffix}@refs.test`, password: 'splitscope-demo' });
  customerId = (await createCustomer(db, { shopId, name: 'References Contracting' })).id;
  boardId = (await createBoardModel(db, { shopId, createdBy: techId, document: OUTDOOR_FAN_BOARD })).id;
  tech = await new Client(server.url).signIn(`tech-${suffix}@refs.test`);
  lead = await new Client(server.url).signIn(`lead-${suffix}@refs.test`);
}, 60_000);
afterAll(async () => {
  await server.close();
});

describe('known-good references', () => {
  it('three labelled sources per point; the model flagged where the good boards disagree', async () => {
    let refs: BoardReferences | undefined;
    for (const [serial, v] of [
      ['GOOD-1', 2.4],
      ['GOOD-2', 2.45],
      ['GOOD-3', 2.38],
    ] as const) {
      const r = await tech.post(`/api/boards/${boardId}/references`, goodBoard(serial, v));
      expect(r.status).toBe(201);
      refs = r.body as unknown as BoardReferences;
    }
    expect(refs!.sets.map((s) => [s.serial, s.origin, s.readings])).toEqual([
      ['GOOD-3', 'recorded', 3],
      ['GOOD-2', 'recorded', 3],
      ['GOOD-1', 'recorded', 3],
    ]);
    const rail = bandOf(refs!, 'TP3')!;
    expect(rail.model?.expected).toBeCloseTo(15, 0);
    expect(rail.measured).toMatchObject({ median: 14.95, boards: 3 });
    expect(rail.published?.source).toMatch(/MC7815C/);
    expect(rail.review).toBeNull();
    const cmd = bandOf(refs!, 'TP9')!;
    expect(cmd.measured?.median).toBe(2.4);
    const modelValue = cmd.model?.expected as number;
    // The flag follows the rule (contract: referenceReview): both bands miss the other's value.
    const disagree = (modelValue < cmd.measured!.low || modelValue > cmd.measured!.high) && (2.4 < cmd.model!.low || 2.4 > cmd.model!.high);
    expect(cmd.review !== null).toBe(disagree);
    if (disagree)
      expect(cmd.review).toMatch(
        /^The model gives .* V \(.*\); 3 known-good boards read 2\.4 V \(median\): check the model's parts and values around this point\.$/,
      );
  });

  it('a point that is not on the board is refused in words', async () => {
    const r = await tech.post(`/api/boards/${boardId}/references`, { readings: [{ mode: 'dcv', red: 'TP99', black: 'gnd', power: 'on', value: 1 }] });
    expect(r.status).toBe(422);
    expect(JSON.stringify(r.body)).toContain('TP99 is not a test point or net of this board');
  });

  it('a lead promotes a signed-off repair; an unverified job is refused', async () => {
    const db = server.ctx.db;
    const jobId = (await createJob(db, { shopId, createdBy: techId, customerId, boardId })).id;
    const early = await lead.post(`/api/jobs/${jobId}/reference`, {});
    expect(early.status).toBe(409);
    expect(JSON.stringify(early.body)).toContain('Only a repaired board signed off as verified is a known-good reference');
    await db.update(jobs).set({ status: 'repaired', proposedPart: 'C9' }).where(eq(jobs.id, jobId));
    await db
      .insert(repairActions)
      .values({ id: newId(), shopId, jobId, part: 'C9', action: 'replaced', authorId: techId, createdAt: new Date(Date.now() - 60_000) });
    const v = await tech.post(`/api/jobs/${jobId}/readings`, {
      idempotencyKey: randomUUID(),
      phase: 'verification',
      mode: 'dcv',
      red: 'TP5',
      black: 'gnd',
      power: 'on',
      value: 14.72,
      raw: '14.72',
    });
    expect(v.status).toBe(201);
    await db.update(jobs).set({ status: 'verified' }).where(eq(jobs.id, jobId));
    expect((await tech.post(`/api/jobs/${jobId}/reference`, {})).status).toBe(403);
    const r = await lead.post(`/api/jobs/${jobId}/reference`, { note: 'C9 replaced, fan runs' });
    expect(r.status).toBe(201);
    const refs = r.body as unknown as BoardReferences;
    expect(refs.sets[0]).toMatchObject({ origin: 'verification', jobId, readings: 1, note: 'C9 replaced, fan runs' });
    expect(bandOf(refs, 'TP5')?.measured?.boards).toBe(4);
    expect((await lead.post(`/api/jobs/${jobId}/reference`, {})).status).toBe(409);
  });
});
