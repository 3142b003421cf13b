// A job's meter profile reaches the engine through the server: chosen at intake (POST /api/jobs) or changed on
// the bench (PATCH), it decides the expected value of a reading through a junction, as the meter model in
// packages/circuit computes it (meter-profiles.ts: profile values from memory), both in the diagnosis and in the
// expected-readings table the bench draws (GET /api/jobs/:id). The shop's default is one column
// of the shop, read by the same query (coalesce of the job's and the shop's); it is not changed here, because the
// demo shop is shared with the other test files.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ANALOG_THEVENIN_20K, applyState, CC_AUTORANGE_6000, measure, parseNetlist, type MeterProfile } from '@splitscope/circuit';
import { GENERIC_METER_LABEL, meterProfileLabels, type BoardDetail, type BoardModel, type Diagnosis, type Job, type JobDetail } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createCustomer, DIVIDER_BOARD } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let admin: Client;
let tech: Client;
let customerId: string;
let boardId: string;

// An invented input: a 10 kΩ feed into a signal junction with a 1 MΩ bleed (a junction Ω reading on "mid").
const NETLIST = '* invented test board\nVS in 0 DC 15\nR1 in mid 10k\nR2 mid 0 1meg\nD1 mid 0 dsig\n.model dsig D(IS=2.5e-9 N=1.75)\n.end\n';

beforeAll(async () => {
  server = await startTestServer();
  customerId = (await createCustomer(server.ctx.db, { shopId: 'shop-demo', name: 'Meter Profile Test Customer' })).id;
  admin = await new Client(server.url).signIn('admin@demo.test');
  tech = await new Client(server.url).signIn('tech@demo.test');
  const key = `meter-${randomUUID().slice(0, 8)}`;
  const doc: BoardModel = {
    ...DIVIDER_BOARD,
    id: key,
    slug: key,
    name: `Junction input ${key}`,
    netlist: NETLIST,
    parts: [
      DIVIDER_BOARD.parts[0]!,
      { ...DIVIDER_BOARD.parts[1]!, value: '1M' },
      {
        designator: 'D1',
        element: 'D1',
        kind: 'diode',
        value: 'signal',
        package: 'SOD-123',
        x: 300,
        y: 100,
        rotation: 0,
        section: 'div',
        pins: [
          { pin: 'A', net: 'mid' },
          { pin: 'K', net: '0' },
        ],
      },
    ],
    // The divider point is also read unpowered in Ω and diode, so the board's table holds junction readings.
    testPoints: [DIVIDER_BOARD.testPoints[0]!, { ...DIVIDER_BOARD.testPoints[1]!, powerStates: ['on', 'off'], modes: ['dcv', 'ohm', 'diode'] }],
  };
  const created = await admin.post('/api/boards', { document: doc });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  boardId = (created.body as unknown as BoardDetail).id;
}, 120_000);
afterAll(() => server.close());

const intake = async (meterProfile?: string) => {
  const r = await tech.post('/api/jobs', { customerId, boardId, unitDescription: 'Test unit', symptom: 'no fan', ...(meterProfile ? { meterProfile } : {}) });
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body as unknown as Job;
};

/** The expected value the engine gives for an unpowered Ω reading mid–0 on this job. */
async function expectedOhm(jobId: string): Promise<number> {
  const w = await tech.post(`/api/jobs/${jobId}/readings`, {
    idempotencyKey: randomUUID(),
    mode: 'ohm',
    red: 'mid',
    black: '0',
    power: 'off',
    value: 200000,
    raw: '200k',
  });
  expect(w.status, JSON.stringify(w.body)).toBe(201);
  const d = await tech.get(`/api/jobs/${jobId}/diagnosis`);
  expect(d.status, JSON.stringify(d.body)).toBe(200);
  return (d.body as unknown as Diagnosis).readings[0]!.expected as number;
}

/** The same reading from the circuit package directly, with the profile named. */
const direct = (meter: MeterProfile) =>
  measure(applyState(parseNetlist(NETLIST), { power: 'off' }), { mode: 'ohm', red: 'mid', black: '0' }, meter).value as number;

describe('a job’s meter profile', () => {
  it('chosen at intake, gives the constant-current meter’s expected value of a junction Ω reading', async () => {
    const job = await intake('cc-autorange-6000');
    expect(job.meterProfile).toBe('cc-autorange-6000');
    expect((await expectedOhm(job.id)) / direct(CC_AUTORANGE_6000)).toBeCloseTo(1, 3);
  }, 120_000);

  it('changed on the bench to the analog meter, the same reading expects the analog meter’s (far lower) value', async () => {
    const job = await intake();
    expect(job.meterProfile).toBeNull();
    const patched = await tech.patch(`/api/jobs/${job.id}`, { meterProfile: 'analog-thevenin-20k' });
    expect(patched.status, JSON.stringify(patched.body)).toBe(200);
    expect((patched.body as unknown as Job).meterProfile).toBe('analog-thevenin-20k');
    const analog = await expectedOhm(job.id);
    expect(analog / direct(ANALOG_THEVENIN_20K)).toBeCloseTo(1, 3);
    expect(direct(CC_AUTORANGE_6000)).toBeGreaterThan(3 * analog);
  }, 120_000);

  it('two jobs on the same board with different meters show different expected junction Ω in the bench’s table', async () => {
    const [cc, analog, none] = await Promise.all([intake('cc-autorange-6000'), intake('analog-thevenin-20k'), intake()]);
    const tableOf = async (id: string) => {
      const r = await tech.get(`/api/jobs/${id}`);
      expect(r.status, JSON.stringify(r.body)).toBe(200);
      const detail = r.body as unknown as JobDetail;
      return { meter: detail.meter, ohm: detail.board.expectedReadings.find((row) => row.id === 'TP2:ohm')!.expected as number };
    };
    const [a, b, c] = [await tableOf(cc.id), await tableOf(analog.id), await tableOf(none.id)];
    expect(a.meter).toEqual({ profile: 'cc-autorange-6000', from: 'job', label: meterProfileLabels['cc-autorange-6000'] });
    expect(b.meter).toEqual({ profile: 'analog-thevenin-20k', from: 'job', label: meterProfileLabels['analog-thevenin-20k'] });
    expect(a.ohm / direct(CC_AUTORANGE_6000)).toBeCloseTo(1, 3);
    expect(b.ohm / direct(ANALOG_THEVENIN_20K)).toBeCloseTo(1, 3);
    expect(a.ohm).toBeGreaterThan(3 * b.ohm);
    // The demo shop names no default meter: a job without one reads the board's stored table, said so in words.
    expect(c.meter).toEqual({ profile: null, from: 'none', label: GENERIC_METER_LABEL });
    const stored = (await tech.get(`/api/boards/${boardId}`)).body as unknown as BoardDetail;
    expect(c.ohm).toBe(stored.expectedReadings.find((row) => row.id === 'TP2:ohm')!.expected);
  }, 120_000);

  it('refuses a profile the engine does not ship', async () => {
    const r = await tech.post('/api/jobs', { customerId, boardId, unitDescription: 'Test unit', symptom: 'no fan', meterProfile: 'no-such-meter' });
    expect(r.status).toBe(422);
  });
});
