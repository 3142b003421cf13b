// A lifted part measured on its own pins ("C10 lifted, Ω across its pins") through the readings API: stored as
// a reading of its own kind (`alone`), judged against the part alone (a healthy 10 nF capacitor is open at DC:
// OL on Ω), refused in words when the part is not lifted or the meter is on DC V, and passed to the diagnosis
// engine, whose ranking it moves (packages/diagnosis/src/electrical/part-alone.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import type { Diagnosis, StoredReading } from '@splitscope/contract';
import { startBench, type Bench } from './bench-fixture';
import type { Client } from './harness';

let bench: Bench;
let tech: Client;

beforeAll(async () => {
  bench = await startBench({ customer: 'Part Alone Repairs', document: { ...OUTDOOR_FAN_BOARD, id: `alone-${randomUUID()}` } });
  ({ tech } = bench);
}, 120_000);
afterAll(() => bench.server.close());

const gate = { safetyCheck: { unplugged: true, busVolts: 1.1 } };
// C10 sits between the fan supply and bus negative (outdoor-sections.ts: "C10 vfan 0 10n").
const alone = (over: Record<string, unknown> = {}) => ({
  idempotencyKey: randomUUID(),
  mode: 'ohm',
  red: 'vfan',
  black: '0',
  power: 'off',
  lifted: ['C10'],
  alone: 'C10',
  value: 2,
  raw: '2',
  ...gate,
  ...over,
});
const post = (jobId: string, body: unknown) => tech.post(`/api/jobs/${jobId}/readings`, body);

describe('a part measured on its own pins', () => {
  it('is stored with the part it measured and judged against the part alone', async () => {
    const jobId = await bench.newJob({ createdBy: 'user-tech', assigneeId: 'user-tech' });
    const r = await post(jobId, alone());
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.alone).toBe('C10');
    expect(r.body.lifted).toEqual(['C10']);
    expect(r.body.expected).toBe('OL'); // the healthy capacitor alone is open at DC
    expect((r.body.verdict as { verdict: string }).verdict).toBe('low');
    const list = (await tech.get(`/api/jobs/${jobId}/readings`)).body as unknown as { items: StoredReading[] };
    expect(list.items.map((x) => x.alone)).toEqual(['C10']);
  });

  it('refuses in words a part that is not lifted, a DC V reading, and probes off the part’s pins', async () => {
    const jobId = await bench.newJob({ createdBy: 'user-tech', assigneeId: 'user-tech' });
    const notLifted = await post(jobId, alone({ lifted: [] }));
    expect(notLifted.status).toBe(422);
    expect(JSON.stringify(notLifted.body)).toMatch(/Lift C10 first/);
    const dcv = await post(jobId, alone({ mode: 'dcv', power: 'on', value: 1, raw: '1' }));
    expect(dcv.status).toBe(422);
    expect(JSON.stringify(dcv.body)).toMatch(/not DC V/);
    const offPins = await post(jobId, alone({ red: 'v15' }));
    expect(offPins.status).toBe(422);
    expect(JSON.stringify(offPins.body)).toMatch(/not a pin of C10/);
  });

  it('moves the ranking: C10 alone at 2 Ω makes "C10 — shorted" the likeliest fault; OL clears C10', async () => {
    const dead = [
      { idempotencyKey: randomUUID(), mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98, raw: '14.98' },
      { idempotencyKey: randomUUID(), mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05, raw: '0.05' },
      { idempotencyKey: randomUUID(), mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: 0.5, beep: true, raw: 'beep', ...gate },
    ];
    const run = async (value: number | 'OL') => {
      const jobId = await bench.newJob({ createdBy: 'user-tech', assigneeId: 'user-tech' });
      for (const body of dead) expect((await post(jobId, { ...body, idempotencyKey: randomUUID() })).status).toBe(201);
      expect((await post(jobId, alone({ value, raw: String(value) }))).status).toBe(201);
      const d = (await tech.get(`/api/jobs/${jobId}/diagnosis`)).body as unknown as Diagnosis;
      return d;
    };
    const shorted = await run(2);
    expect(shorted.parts[0]).toMatchObject({ part: 'C10', mode: 'short' });
    expect(shorted.readings[3]).toMatchObject({ alone: 'C10', expected: 'OL' });
    const open = await run('OL');
    expect(open.parts[0]!.part).not.toBe('C10');
  }, 240_000);
});
