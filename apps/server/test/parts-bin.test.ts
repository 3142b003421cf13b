// The parts bin: drawers of replacement parts; a repair takes from one (value and package checked against the board
// model's part), the reorder list shows drawers under their minimum, and a quote is pre-filled from the parts used.
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { binPartListResponse, quoteDraftResponse, type BinPart } from '@splitscope/contract';
import { jobs } from '../src/db/schema';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let admin: Client;
let other: Client;
let jobId: string;
const drawer = `D-${randomUUID().slice(0, 6)}`;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Bin Test Cooling' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id })).id;
  // The repair is what this test is about: the job is put where repairs are recorded (the flow itself is report.test.ts).
  await db.update(jobs).set({ status: 'approved', proposedPart: 'R2' }).where(eq(jobs.id, jobId));
  tech = await new Client(server.url).signIn('tech@demo.test');
  admin = await new Client(server.url).signIn('admin@demo.test');
  other = await new Client(server.url).signIn('tech@other.test');
}, 120_000);
afterAll(() => server.close());

const stock = async (body: Record<string, unknown>) => {
  const res = await tech.post('/api/parts-bin', { package: '0805', drawer, quantity: 3, minimum: 2, unitCents: 25, ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as unknown as BinPart;
};

describe('parts bin', () => {
  it('refuses a drawer whose value is no value, and parses values like the reading field', async () => {
    const banana = await tech.post('/api/parts-bin', { value: 'banana', package: '0805', drawer, quantity: 5 });
    expect(banana.status).toBe(422);
    expect(String(banana.body.detail)).toMatch(/"banana" is not a part value/);
    expect((await stock({ value: '4k7' })).nominal).toBe(4700);
    expect((await stock({ value: '1.2 MΩ', package: '1206' })).nominal).toBe(1_200_000);
    expect((await stock({ value: '1N4148', package: 'SOD-123' })).nominal).toBeNull();
  });

  it('takes stock when a repair fits the board part from a drawer, and refuses another value or package', async () => {
    const tenK = await stock({ value: '10.0k', quantity: 3, minimum: 2, unitCents: 35, rating: '0.125 W' });
    const wrongValue = await stock({ value: '1k', quantity: 3 });
    const wrongPackage = await stock({ value: '10k', package: '1206', quantity: 3 });

    const refused = await tech.post(`/api/jobs/${jobId}/repairs`, { part: 'R2', action: 'replaced', binPartId: wrongValue.id });
    expect(refused.status).toBe(422);
    expect(String(refused.body.detail)).toBe("The drawer's part does not fit: R2 is 10k; this drawer holds 1k");
    const refusedPackage = await tech.post(`/api/jobs/${jobId}/repairs`, { part: 'R2', action: 'replaced', binPartId: wrongPackage.id });
    expect(String(refusedPackage.body.detail)).toBe("The drawer's part does not fit: R2 is 0805; this drawer holds 1206");
    const notOnBoard = await tech.post(`/api/jobs/${jobId}/repairs`, { part: 'C99', action: 'replaced', binPartId: tenK.id });
    expect(String(notOnBoard.body.detail)).toMatch(/C99 is not a part of this board model/);

    const fitted = await tech.post(`/api/jobs/${jobId}/repairs`, { part: 'R2', action: 'replaced', binPartId: tenK.id, binQuantity: 2 });
    expect(fitted.status, JSON.stringify(fitted.body)).toBe(201);
    expect(fitted.body).toMatchObject({ part: 'R2', replacementValue: '10.0k' });

    const list = binPartListResponse.parse((await tech.get('/api/parts-bin')).body);
    expect(list.items.find((p) => p.id === tenK.id)).toMatchObject({ quantity: 1, reorder: true });
    expect(list.items.find((p) => p.id === wrongValue.id)).toMatchObject({ quantity: 3, reorder: false });

    // The reorder list: the drawer fell under its minimum of 2.
    const reorder = binPartListResponse.parse((await tech.get('/api/parts-bin/reorder')).body);
    expect(reorder.items.map((p) => p.id)).toContain(tenK.id);
    expect(reorder.items.every((p) => p.quantity < p.minimum)).toBe(true);

    // Never below zero: asking for more than the drawer holds stores no repair.
    const tooMany = await tech.post(`/api/jobs/${jobId}/repairs`, { part: 'R2', action: 'replaced', binPartId: tenK.id, binQuantity: 2 });
    expect(tooMany.status).toBe(409);
    expect(String(tooMany.body.detail)).toMatch(/holds 1 of 10.0k 0805; the repair asks for 2/);
    expect(((await tech.get(`/api/jobs/${jobId}/repairs`)).body as unknown as { items: unknown[] }).items).toHaveLength(1);
  });

  it('pre-fills the quote lines from the parts used and the shop’s labour rate', async () => {
    const terms = (await admin.get(`/api/service-terms`)).body as unknown as { labourRateCents: number; repairMinutes: number };
    expect((await admin.patch('/api/service-terms', { labourRateCents: 6000, repairMinutes: 90 })).status).toBe(200);
    try {
      const draft = quoteDraftResponse.parse((await tech.get(`/api/jobs/${jobId}/quote-draft`)).body);
      expect(draft.lines).toEqual([
        { kind: 'part', description: 'R2: 10.0k 0805, 0.125 W', quantity: '2', unitCents: 35, taxable: true },
        { kind: 'labour', description: 'Bench labour (1 repair)', quantity: '1.5', unitCents: 6000, taxable: true },
      ]);
    } finally {
      await admin.patch('/api/service-terms', { labourRateCents: terms.labourRateCents, repairMinutes: terms.repairMinutes });
    }
  });

  it('keeps each shop’s bin its own', async () => {
    const mine = binPartListResponse.parse((await tech.get('/api/parts-bin')).body);
    const theirs = binPartListResponse.parse((await other.get('/api/parts-bin')).body);
    expect(theirs.items.some((p) => mine.items.some((m) => m.id === p.id))).toBe(false);
    expect((await other.patch(`/api/parts-bin/${mine.items[0]!.id}`, { quantity: 0 })).status).toBe(404);
  });
});
