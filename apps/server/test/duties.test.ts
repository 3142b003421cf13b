// Separation of duties per shop (hole 11): by default the proposer of a diagnosis does not approve it, and a
// reading someone else took is corrected only by a lead or above; an admin can relax both for a small shop.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBench, type Bench } from './bench-fixture';
import type { Client } from './harness';
import { dividerReading } from '../src/testing/requests';

let bench: Bench;
let admin: Client;
let lead: Client;
let tech: Client;
let trainee: Client;

beforeAll(async () => {
  bench = await startBench({ customer: 'Duties Test Cooling' });
  ({ admin, lead, tech, trainee } = bench);
});
afterAll(async () => {
  await admin.patch('/api/shop/duties', { selfApproval: false, correctOthersMinRole: 'lead' });
  await bench.server.close();
});

const newJob = (assigneeId = 'user-trainee') => bench.newJob({ createdBy: 'user-lead', assigneeId });
// The divider board: 15 V over 10k/10k reads about 7.5 V at TP2.

describe('separation of duties', () => {
  it('reads the defaults, and only an admin changes them', async () => {
    expect((await tech.get('/api/shop/duties')).body).toEqual({ selfApproval: false, correctOthersMinRole: 'lead' });
    expect((await lead.patch('/api/shop/duties', { selfApproval: true })).status).toBe(403);
    expect((await admin.patch('/api/shop/duties', { correctOthersMinRole: 'wizard' })).status).toBe(422);
  });

  it('refuses the proposer approving their own proposal unless the shop allows it', async () => {
    const job = await newJob('user-lead');
    expect((await lead.post(`/api/jobs/${job}/readings`, dividerReading({ value: 2.1, raw: '2.1' }))).status).toBe(201);
    expect((await lead.patch(`/api/jobs/${job}`, { status: 'awaiting-review', proposedPart: 'R2' })).status).toBe(200);
    const own = await lead.post(`/api/jobs/${job}/reviews`, { decision: 'approve', comment: 'R2 open' });
    expect(own.status).toBe(403);
    expect(String(own.body.detail)).toMatch(/You proposed this diagnosis/);
    // a second person approves it
    expect((await admin.post(`/api/jobs/${job}/reviews`, { decision: 'approve', comment: 'R2 open, agreed' })).status).toBe(201);

    const next = await newJob('user-lead');
    await lead.post(`/api/jobs/${next}/readings`, dividerReading({ value: 2.1, raw: '2.1' }));
    await lead.patch(`/api/jobs/${next}`, { status: 'awaiting-review', proposedPart: 'R2' });
    expect((await admin.patch('/api/shop/duties', { selfApproval: true })).status).toBe(200);
    expect((await lead.post(`/api/jobs/${next}/reviews`, { decision: 'approve', comment: 'one-person bench' })).status).toBe(201);
    await admin.patch('/api/shop/duties', { selfApproval: false });
  });

  it("lets a trainee or technician correct only their own readings, and a lead anyone's", async () => {
    const job = await newJob('user-trainee');
    const leads = await lead.post(`/api/jobs/${job}/readings`, dividerReading());
    expect(leads.status).toBe(201);
    const byTrainee = await trainee.post(`/api/jobs/${job}/readings`, dividerReading({ supersedes: String(leads.body.id) }));
    expect(byTrainee.status).toBe(403);
    expect(String(byTrainee.body.detail)).toMatch(/needs a lead or above/);
    const techs = await tech.post(`/api/jobs/${job}/readings`, dividerReading({ value: 7.4, raw: '7.4' }));
    expect((await tech.post(`/api/jobs/${job}/readings`, dividerReading({ supersedes: String(leads.body.id) }))).status).toBe(403);
    expect((await tech.post(`/api/jobs/${job}/readings`, dividerReading({ supersedes: String(techs.body.id), value: 7.45, raw: '7.45' }))).status).toBe(201);
    expect((await lead.post(`/api/jobs/${job}/readings`, dividerReading({ supersedes: String(leads.body.id), value: 7.5, raw: '7.50' }))).status).toBe(201);

    // a shop that lets technicians correct each other
    expect((await admin.patch('/api/shop/duties', { correctOthersMinRole: 'tech' })).status).toBe(200);
    const again = await lead.post(`/api/jobs/${job}/readings`, dividerReading({ value: 7.6, raw: '7.6' }));
    expect((await tech.post(`/api/jobs/${job}/readings`, dividerReading({ supersedes: String(again.body.id) }))).status).toBe(201);
  });
});
