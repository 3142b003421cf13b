// A board that comes back: its earlier jobs by board serial (and by unit serial), what was measured, which part was
// replaced and by whom, and the warranty flag at intake and on the new job.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { boardHistoryResponse, type BoardHistory } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let lead: Client;
let admin: Client;
let other: Client;
let boardId: string;
let customerId: string;
const serial = `BRD-${randomUUID().slice(0, 8)}`;
const unitSerial = `ODU-${randomUUID().slice(0, 8)}`;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  customerId = (await createCustomer(db, { shopId: 'shop-demo', name: 'History Test Cooling' })).id;
  boardId = (await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  lead = await new Client(server.url).signIn('lead@demo.test');
  admin = await new Client(server.url).signIn('admin@demo.test');
  other = await new Client(server.url).signIn('tech@other.test');
}, 120_000);
afterAll(() => server.close());

const reading = (over: Record<string, unknown>) => ({ idempotencyKey: randomUUID(), mode: 'dcv', red: 'TP2', black: 'gnd', power: 'on', ...over });
const history = async (c: Client, path: string): Promise<BoardHistory> => {
  const res = await c.get(path);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return boardHistoryResponse.parse(res.body);
};

/** The divider board through the whole flow: R2 found open, replaced, verified, returned to the customer. */
async function repairedAndReturned(): Promise<{ id: string; number: number }> {
  const made = await tech.post('/api/jobs', { customerId, boardId, unitDescription: 'Outdoor unit', serial, unitSerial, symptom: 'Fan never starts' });
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  const id = String(made.body.id);
  expect((await tech.post(`/api/jobs/${id}/readings`, reading({ value: 2.1, raw: '2.1' }))).status).toBe(201);
  expect((await tech.patch(`/api/jobs/${id}`, { status: 'awaiting-review', proposedPart: 'R2' })).status).toBe(200);
  expect((await lead.post(`/api/jobs/${id}/reviews`, { decision: 'approve', comment: 'R2 open' })).status).toBe(201);
  expect((await tech.post(`/api/jobs/${id}/repairs`, { part: 'R2', action: 'replaced', replacementValue: '10k' })).status).toBe(201);
  expect((await tech.post(`/api/jobs/${id}/readings`, reading({ phase: 'verification', value: 7.5, raw: '7.5' }))).status).toBe(201);
  expect((await tech.post(`/api/jobs/${id}/readings`, reading({ phase: 'verification', red: 'TP1', value: 15, raw: '15' }))).status).toBe(201);
  expect((await tech.patch(`/api/jobs/${id}`, { status: 'repaired' })).status).toBe(200);
  const signOff = await lead.patch(`/api/jobs/${id}`, { status: 'verified', functionalCheckDone: true });
  expect(signOff.status, JSON.stringify(signOff.body)).toBe(200);
  const back = await tech.patch(`/api/jobs/${id}`, { status: 'returned', returnedVia: 'courier' });
  expect(back.status, JSON.stringify(back.body)).toBe(200);
  return { id, number: Number(made.body.number) };
}

describe('board history by serial', () => {
  let first: { id: string; number: number };

  it('shows a returning board its earlier job, readings, the part replaced and who did it, flagged as a warranty return at intake', async () => {
    first = await repairedAndReturned();
    // The counter types the serial in another case: the match ignores it.
    const atIntake = await history(tech, `/api/board-history?serial=${serial.toLowerCase()}`);
    expect(atIntake.jobs.map((j) => j.number)).toEqual([first.number]);
    const [earlier] = atIntake.jobs;
    expect(earlier).toMatchObject({
      matchedBy: 'board serial',
      status: 'returned',
      proposedPart: 'R2',
      repairs: [{ part: 'R2', action: 'replaced', replacementValue: '10k', byName: expect.any(String) }],
    });
    expect(earlier!.repairs[0]!.byName).not.toBe('');
    // Readings in the bench's words: the test point and its label, the meter function, the board's state.
    expect(earlier!.readings.map((r) => r.where)).toContain('TP2 divider to bus negative, DC V, powered');
    expect(earlier!.readings.find((r) => r.raw === '7.5')).toMatchObject({ phase: 'verification', verdict: 'ok' });
    expect(atIntake.warranty).toMatchObject({ jobNumber: first.number, daysSince: 0, warrantyDays: atIntake.warrantyDays });
  }, 180_000); // the first proposal runs the diagnosis of this board: seconds of engine work on a busy machine

  it('finds the same job by the unit serial, and flags the new job itself', async () => {
    const byUnit = await history(tech, `/api/board-history?unitSerial=${unitSerial}`);
    expect(byUnit.jobs).toMatchObject([{ number: first.number, matchedBy: 'unit serial' }]);

    const again = await tech.post('/api/jobs', { customerId, boardId, unitDescription: 'Outdoor unit', serial, symptom: 'Fan stops after a minute' });
    expect(again.status).toBe(201);
    const onJob = await history(tech, `/api/jobs/${String(again.body.id)}/history`);
    expect(onJob.jobs.map((j) => j.id)).toEqual([first.id]);
    expect(onJob.warranty).toMatchObject({ jobNumber: first.number });
  });

  it('takes the warranty days from the shop’s service terms, which only an admin changes', async () => {
    expect((await tech.patch('/api/service-terms', { warrantyDays: 0 })).status).toBe(403);
    const terms = await admin.get('/api/service-terms');
    try {
      // Zero days: only a board back on the day it left is inside. The day count at the boundary and past it is
      // warrantyReturn's unit test (contract), which takes the dates.
      expect((await admin.patch('/api/service-terms', { warrantyDays: 0 })).status).toBe(200);
      expect((await history(tech, `/api/board-history?serial=${serial}`)).warranty).toMatchObject({ warrantyDays: 0, daysSince: 0 });
    } finally {
      await admin.patch('/api/service-terms', { warrantyDays: (terms.body as unknown as { warrantyDays: number }).warrantyDays });
    }
  });

  it('keeps another shop’s boards out of the history', async () => {
    expect((await history(other, `/api/board-history?serial=${serial}`)).jobs).toEqual([]);
    expect((await other.get(`/api/jobs/${first.id}/history`)).status).toBe(404);
    expect((await tech.get('/api/board-history')).status).toBe(422);
  });
});
