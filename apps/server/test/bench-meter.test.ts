// The bench meter over SCPI, end to end in one process: the real server, the bridge signed in as the technician,
// and the SCPI meter simulator on a socat terminal pair. A request armed on the bench is served by the bridge
// (CONF, TRIG:SOUR, READ?), the meter's trigger sends the answer, and the reading lands through the bench's own
// reading write: its validation, verdict and discharge gate; what the server cannot read is refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { benchMeterStatusResponse, readingListResponse, type BenchMeterStatus } from '@splitscope/contract';
import { runBridge } from '../../meter-bridge/src/bridge';
import { ScpiMeter } from '../../meter-bridge/src/scpi-meter';
import { openSerialLines } from '../../meter-bridge/src/serial-lines';
import { ServerLink } from '../../meter-bridge/src/server-link';
import { hasSocat, openPtyPair, type PtyPair } from '../../meter-bridge/sim/pty-pair';
import { ScpiMeterSim } from '../../meter-bridge/sim/scpi-meter-sim';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob, DIVIDER_BOARD } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

const socat = hasSocat();
if (!socat) console.warn('bench-meter.test.ts: skipped: socat is not installed (apt-get install socat; `npm test` installs it)');

let server: RunningServer;
let tech: Client;
let other: Client;
let jobId: string;
let gatedJobId: string;
let pair: PtyPair;
let sim: ScpiMeterSim;
let meter: ScpiMeter;
let bridge: Promise<void>;
const stop = new AbortController();
const log: string[] = [];

async function until<T>(what: string, get: () => Promise<T> | T, ok: (v: T) => boolean, ms = 5000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await get();
    if (ok(v)) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}; last: ${JSON.stringify(v)}; bridge log: ${log.join(' | ')}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

const status = async (job = jobId): Promise<BenchMeterStatus> => benchMeterStatusResponse.parse((await tech.get(`/api/jobs/${job}/bench-meter`)).body);
const settled = (job = jobId) =>
  until(
    'the request to end',
    () => status(job),
    (s) => s.arm?.state !== 'waiting',
  );
const readingsOf = async (job: string) => readingListResponse.parse((await tech.get(`/api/jobs/${job}/readings`)).body).items;

async function arm(body: Record<string, unknown>, job = jobId) {
  const res = await tech.post(`/api/jobs/${job}/bench-meter`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  await until('the meter to wait for its trigger', () => sim.armed, Boolean);
  // The bench says "press its trigger" once the server has the test's expected value at hand.
  await until(
    'the request to be ready',
    () => status(job),
    (s) => s.arm?.ready === true,
  );
  return String(res.body.id);
}

describe.skipIf(!socat)('bench meter over SCPI', () => {
  beforeAll(async () => {
    server = await startTestServer();
    const db = server.ctx.db;
    const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Bench Meter Test Cooling' });
    const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
    // The same divider with its section marked as touching the bus, so unpowered readings there pass the gate.
    const busDoc = {
      ...DIVIDER_BOARD,
      id: `test-bus-divider-${crypto.randomUUID()}`,
      testPoints: DIVIDER_BOARD.testPoints.map((t) => ({ ...t, touchesBus: true })),
    };
    const gated = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin', document: busDoc });
    jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id })).id;
    gatedJobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: gated.id })).id;
    tech = await new Client(server.url).signIn('tech@demo.test');
    other = await new Client(server.url).signIn('tech@other.test');

    pair = await openPtyPair();
    sim = await ScpiMeterSim.open(pair.simPort);
    sim.noise = 0;
    meter = new ScpiMeter(await openSerialLines(pair.meterPort));
    const link = new ServerLink(server.url);
    await link.signIn('tech@demo.test', 'splitscope-demo');
    bridge = runBridge({ meter, link, log: (l) => log.push(l), signal: stop.signal });
  }, 120_000);

  afterAll(async () => {
    stop.abort();
    await bridge?.catch(() => undefined);
    await meter?.close();
    await sim?.close();
    await pair?.close();
    await server?.close();
  });

  it('identifies the meter (*IDN?) and shows the bench which meter is connected', async () => {
    const s = await until(
      'the bridge to check in',
      () => status(),
      (x) => x.bridge !== null,
    );
    expect(sim.received[0]).toBe('*IDN?');
    expect(s.bridge).toMatchObject({ instrument: 'Invented Instruments BM-2300', connected: true });
    expect(s.arm).toBeNull();
  });

  it('a DC V reading triggered on the meter lands through the reading write, with its verdict', async () => {
    sim.set('VOLT:DC', 15.02);
    const id = await arm({ mode: 'dcv', red: 'TP1', black: 'gnd', power: 'on' });
    expect(sim.received.slice(-3)).toEqual(['CONF:VOLT:DC', 'TRIG:SOUR EXT', 'READ?']);
    expect(await sim.press()).toBe(true);
    const s = await settled();
    expect(s.arm).toMatchObject({ id, state: 'taken', refusal: null });
    expect(s.arm!.reading).toMatchObject({
      mode: 'dcv',
      red: 'TP1',
      value: 15.02,
      unit: 'V',
      raw: '+1.5020E+01',
      instrument: 'Invented Instruments BM-2300',
      authorName: expect.any(String),
    });
    expect(s.arm!.reading!.verdict).toMatchObject({ verdict: 'ok', expected: 15 });
    expect((await readingsOf(jobId)).map((r) => r.id)).toContain(s.arm!.reading!.id);
  });

  it('reads at once when the bench asks for it now (TRIG:SOUR IMM), and an overload (9.9E37) is stored as OL', async () => {
    sim.set('RES', 'OL');
    const res = await tech.post(`/api/jobs/${jobId}/bench-meter`, { mode: 'ohm', red: 'TP2', black: 'gnd', power: 'off', trigger: 'now' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const s = await settled();
    expect(sim.received.slice(-3)).toEqual(['CONF:RES', 'TRIG:SOUR IMM', 'READ?']);
    expect(s.arm!.reading).toMatchObject({ mode: 'ohm', value: 'OL', raw: '+9.90000000E+37' });
  });

  it('refuses an answer it cannot read (SCPI not-a-number) and stores nothing', async () => {
    const before = (await readingsOf(jobId)).length;
    const id = await arm({ mode: 'dcv', red: 'TP2', black: 'gnd', power: 'on' });
    const res = await tech.post(`/api/bench-meter/requests/${id}/reading`, { answer: '+9.91E+37', instrument: 'Invented Instruments,BM-2300,SIM0001,1.0' });
    expect(res.status).toBe(422);
    expect(res.body.detail).toBe('Not stored: the meter answered "+9.91E+37" (not a number in SCPI): take the reading again.');
    const s = await status();
    expect(s.arm).toMatchObject({ id, state: 'refused', reading: null });
    expect((await readingsOf(jobId)).length).toBe(before);
    // The bridge hears the request ended and stops the meter waiting for its trigger.
    await until(
      'the meter to stop waiting',
      () => sim.armed,
      (a) => !a,
    );
    expect(sim.received.at(-1)).toBe('ABOR');
  });

  it('keeps the discharge gate: an unpowered reading on the bus is refused without it and stored with it', async () => {
    sim.set('RES', 9870);
    await arm({ mode: 'ohm', red: 'TP2', black: 'gnd', power: 'off' }, gatedJobId);
    await sim.press();
    const refused = await settled(gatedJobId);
    expect(refused.arm!.state).toBe('refused');
    expect(refused.arm!.refusal).toMatch(/discharge|bus/i);
    expect(await readingsOf(gatedJobId)).toHaveLength(0);

    await arm({ mode: 'ohm', red: 'TP2', black: 'gnd', power: 'off', safetyCheck: { unplugged: true, busVolts: 1.2 } }, gatedJobId);
    await sim.press();
    const taken = await settled(gatedJobId);
    expect(taken.arm!.reading).toMatchObject({ value: 9870, unit: 'ohm', safetyBusVolts: 1.2 });
  });

  it('a cancel on the bench stops the meter waiting (ABOR), and nothing is stored', async () => {
    const before = (await readingsOf(jobId)).length;
    await arm({ mode: 'diode', red: 'TP2', black: 'gnd', power: 'off' });
    expect(sim.received.slice(-3)).toEqual(['CONF:DIOD', 'TRIG:SOUR EXT', 'READ?']);
    const res = await tech.request('DELETE', `/api/jobs/${jobId}/bench-meter`);
    expect(res.status).toBe(200);
    expect(benchMeterStatusResponse.parse(res.body).arm!.state).toBe('cancelled');
    await until(
      'the meter to stop waiting',
      () => sim.armed,
      (a) => !a,
    );
    expect(await sim.press()).toBe(false);
    expect((await readingsOf(jobId)).length).toBe(before);
  });

  it('serves a request only to the bridge of the person who asked; another shop sees no job', async () => {
    const id = await arm({ mode: 'dcv', red: 'TP1', black: 'gnd', power: 'on' });
    expect((await other.get('/api/bench-meter/next')).body).toEqual({ request: null });
    expect((await other.post(`/api/bench-meter/requests/${id}/reading`, { answer: '+1.5E+01' })).status).toBe(404);
    expect((await other.get(`/api/jobs/${jobId}/bench-meter`)).status).toBe(404);
    expect((await other.post(`/api/jobs/${jobId}/bench-meter`, { mode: 'dcv', red: 'TP1', black: 'gnd', power: 'on' })).status).toBe(404);
    expect((await new Client(server.url).get('/api/bench-meter/next')).status).toBe(401);
    expect((await tech.request('DELETE', `/api/jobs/${jobId}/bench-meter`)).status).toBe(200);
  });

  it('refuses a request the reading write would refuse for the meter function alone (Ω on a powered board)', async () => {
    const res = await tech.post(`/api/jobs/${jobId}/bench-meter`, { mode: 'ohm', red: 'TP2', black: 'gnd', power: 'on' });
    expect(res.status).toBe(422);
    expect(res.body.errors).toEqual([expect.objectContaining({ path: 'power' })]);
  });
});
