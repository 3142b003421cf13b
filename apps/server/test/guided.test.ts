// Trainees record readings in guided order only, and an unpowered step on a bus section needs the discharge
// gate first: the server refuses what the bench screen would not offer.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import type { Diagnosis, ExpectedReadingRow, StoredReading } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let trainee: Client;
let jobId: string;
let expected: ExpectedReadingRow[];

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Guided Order Contracting' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin', document: { ...OUTDOOR_FAN_BOARD, id: `guided-${randomUUID()}` } });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id, assigneeId: 'user-trainee' })).id;
  trainee = await new Client(server.url).signIn('trainee@demo.test');
  expected = ((await trainee.get(`/api/jobs/${jobId}`)).body as unknown as { board: { expectedReadings: ExpectedReadingRow[] } }).board.expectedReadings;
}, 120_000);
afterAll(() => server.close());

type Step = Diagnosis['nextTests'][number];
const next = async (): Promise<Step> => ((await trainee.get(`/api/jobs/${jobId}/diagnosis`)).body as unknown as Diagnosis).nextTests[0]!;
const netOf = (p: string) => (OUTDOOR_FAN_BOARD.testPoints.find((t) => t.id.toLowerCase() === p.toLowerCase())?.net ?? p).toLowerCase();
const healthy = (s: Step) => {
  const row = expected.find(
    (r) =>
      r.mode === s.mode &&
      r.power === s.power &&
      netOf(r.red) === netOf(s.red) &&
      netOf(r.black) === netOf(s.black) &&
      [...r.lifted].sort().join() === [...s.lifted].sort().join(),
  );
  const v = row?.expected ?? 0;
  return typeof v === 'boolean' ? { value: v ? 0.2 : ('OL' as const), beep: v } : { value: v };
};
const post = (s: Step, over: Record<string, unknown> = {}) =>
  trainee.post(`/api/jobs/${jobId}/readings`, {
    idempotencyKey: randomUUID(),
    mode: s.mode,
    red: s.red,
    black: s.black,
    power: s.power,
    lifted: s.lifted,
    raw: 'typed',
    ...healthy(s),
    ...over,
  });

describe('guided order for trainees', () => {
  it('refuses a reading that is not one of the steps the engine gives next, naming the next step', async () => {
    const step = await next();
    const other = expected.find((r) => r.power === 'on' && !(netOf(r.red) === netOf(step.red) && r.mode === step.mode))!;
    const r = await trainee.post(`/api/jobs/${jobId}/readings`, {
      idempotencyKey: randomUUID(),
      mode: other.mode,
      red: other.red,
      black: other.black,
      power: 'on',
      value: 1,
      raw: '1',
    });
    expect(r.status).toBe(409);
    expect(String(r.body.detail)).toContain(`Next step: ${step.instruction}`);
  }, 60_000);

  it('takes the steps in order, and before an unpowered bus step asks for the gate, refusing a bus still charged', async () => {
    let step = await next();
    let firstId: string | undefined;
    for (let i = 0; i < 12 && step.power === 'on'; i++) {
      const r = await post(step);
      expect(r.status, JSON.stringify(r.body)).toBe(201);
      firstId ??= r.body.id as string;
      step = await next();
    }
    // (the engine may well start with an unpowered step: a resistance reading can split more candidates)
    expect(step.power, 'the guided order reaches an unpowered step').toBe('off');
    const none = await post(step);
    expect(none.status).toBe(422);
    expect(String(none.body.detail)).toMatch(/unplugged.*bus voltage/);
    const charged = await post(step, { safetyCheck: { unplugged: true, busVolts: 150 } });
    expect(charged.status).toBe(422);
    expect(String(charged.body.detail)).toMatch(/150 V, not below 60 V/);
    const ok = await post(step, { safetyCheck: { unplugged: true, busVolts: 2.1 } });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.safetyBusVolts).toBe(2.1);

    // A typo fixed on a step already taken is a correction, not skipping ahead; a "correction" that changes the probes is not.
    firstId ??= ok.body.id as string;
    const items = (await trainee.get(`/api/jobs/${jobId}/readings`)).body.items as StoredReading[];
    const first = items.find((x) => x.id === firstId)!;
    const gate = first.power === 'off' ? { safetyCheck: { unplugged: true, busVolts: 1.2 } } : {};
    const fix = await trainee.post(`/api/jobs/${jobId}/readings`, {
      idempotencyKey: randomUUID(),
      mode: first.mode,
      red: first.red,
      black: first.black,
      power: first.power,
      lifted: first.lifted,
      value: first.value,
      raw: 'retyped',
      supersedes: firstId,
      ...gate,
    });
    expect(fix.status, JSON.stringify(fix.body)).toBe(201);
    const moved = await trainee.post(`/api/jobs/${jobId}/readings`, {
      idempotencyKey: randomUUID(),
      mode: 'dcv',
      red: 'TP1',
      black: '0',
      power: 'on',
      value: 1,
      raw: '1',
      supersedes: fix.body.id,
    });
    if (netOf(first.red) !== netOf('TP1')) expect(moved.status).toBe(409);
  }, 180_000);

  it("refuses a trainee verification reading: those follow a repair and are a technician's", async () => {
    const step = await next();
    const r = await post(step, { phase: 'verification' });
    expect(r.status).toBe(403);
  }, 60_000);
});
