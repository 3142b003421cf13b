// Guided order lifted for a trainee across all of that trainee's jobs (policy: guidedOrderBinds with the
// trainee's lift beside the job's): only a lead or admin may lift it, only for a trainee, and it frees every job
// of that trainee at once — the one-job lift stays as it was.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import type { Diagnosis, JobDetail, ShopMember } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob, createUser } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let lead: Client;
let tech: Client;
let trainee: Client;
let traineeId: string;
let boardId: string;
let customerId: string;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  // A trainee of its own: the demo trainee's lift must not change under other tests.
  const email = `trainee-${randomUUID()}@example.test`;
  traineeId = (await createUser(db, { shopId: 'shop-demo', email, name: 'Lift Trainee', role: 'trainee', password: 'trainee-lift-pass-1' })).id;
  customerId = (await createCustomer(db, { shopId: 'shop-demo', name: 'Trainee Lift Refrigeration' })).id;
  boardId = (await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin', document: { ...OUTDOOR_FAN_BOARD, id: `lift-${randomUUID()}` } })).id;
  lead = await new Client(server.url).signIn('lead@demo.test');
  tech = await new Client(server.url).signIn('tech@demo.test');
  trainee = await new Client(server.url).signIn(email, 'trainee-lift-pass-1');
}, 120_000);
afterAll(() => server.close());

const newJob = async () => (await createJob(server.ctx.db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId, boardId, assigneeId: traineeId })).id;
const detail = async (c: Client, jobId: string) => (await c.get(`/api/jobs/${jobId}`)).body as unknown as JobDetail;

/** A powered reading that is not the engine's first step on a fresh job, so guided order refuses it. */
async function outOfOrder(jobId: string) {
  const d = (await trainee.get(`/api/jobs/${jobId}/diagnosis`)).body as unknown as Diagnosis;
  const candidates = ['TP12', 'TP3', 'TP5'];
  const red = candidates.find((tp) => !(d.nextTests[0]?.power === 'on' && d.nextTests[0]?.mode === 'dcv' && d.nextTests[0]?.red === tp))!;
  return { idempotencyKey: randomUUID(), mode: 'dcv', red, black: '0', power: 'on', value: 0.2, raw: '0.2' };
}

describe('guided order lifted for a trainee on all their jobs', () => {
  it('is refused to a technician and the trainee, and to a lead for someone who is not a trainee', async () => {
    expect((await tech.put(`/api/users/${traineeId}/guided-order`, { lifted: true })).status).toBe(403);
    expect((await trainee.put(`/api/users/${traineeId}/guided-order`, { lifted: true })).status).toBe(403);
    const notTrainee = await lead.put('/api/users/user-tech/guided-order', { lifted: true });
    expect(notTrainee.status).toBe(409);
    expect(String(notTrainee.body.detail)).toMatch(/binds trainees only/);
    const wrong = await lead.put(`/api/users/${traineeId}/guided-order`, { lifted: 'yes' });
    expect(wrong.status).toBe(422);
    expect(JSON.stringify(wrong.body)).toMatch(/Say whether guided order is lifted/);
  });

  it('frees every job of the trainee at once, shows on the jobs and the people list, and is put back', async () => {
    const [a, b] = [await newJob(), await newJob()];
    expect((await detail(trainee, a)).guidedOrderRequired).toBe(true);
    expect((await detail(lead, a)).assigneeGuidedLifted).toBe(false);
    const refused = await trainee.post(`/api/jobs/${a}/readings`, await outOfOrder(a));
    expect(refused.status).toBe(409);

    const lifted = await lead.put(`/api/users/${traineeId}/guided-order`, { lifted: true });
    expect(lifted.status, JSON.stringify(lifted.body)).toBe(200);
    expect((lifted.body as unknown as ShopMember).guidedLifted).toBe(true);
    const people = (await lead.get('/api/users')).body as unknown as { items: ShopMember[] };
    expect(people.items.find((p) => p.id === traineeId)?.guidedLifted).toBe(true);
    // Both jobs, neither lifted on its own.
    for (const jobId of [a, b]) {
      const d = await detail(trainee, jobId);
      expect(d.guidedLifted).toBe(false);
      expect(d.guidedOrderRequired).toBe(false);
      expect((await detail(lead, jobId)).assigneeGuidedLifted).toBe(true);
      const r = await trainee.post(`/api/jobs/${jobId}/readings`, await outOfOrder(jobId));
      expect(r.status, JSON.stringify(r.body)).toBe(201);
    }
    // A job opened after the lift is free too.
    expect((await detail(trainee, await newJob())).guidedOrderRequired).toBe(false);

    expect((await lead.put(`/api/users/${traineeId}/guided-order`, { lifted: false })).status).toBe(200);
    const c = await newJob();
    expect((await detail(trainee, c)).guidedOrderRequired).toBe(true);
    expect((await trainee.post(`/api/jobs/${c}/readings`, await outOfOrder(c))).status).toBe(409);
  }, 120_000);
});
