// The board library over the API: the seeded demo boards, their expected-readings tables computed by the board
// library (sourced bands, the parallel-path note), verdicts against a sourced band, and a composed board stored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { composeBoard, INDOOR_FAN_BOARD } from '@splitscope/boards';
import type { BoardDetail, ExpectedReadingRow } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let admin: Client;
let jobId: string;

beforeAll(async () => {
  server = await startTestServer();
  const customer = await createCustomer(server.ctx.db, { shopId: 'shop-demo', name: 'Indoor Board Contracting' });
  jobId = (
    await createJob(server.ctx.db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: 'board-demo-idf-310', faultCode: 'E1' })
  ).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  admin = await new Client(server.url).signIn('admin@demo.test');
}, 120_000);
afterAll(() => server.close());

const tpOf = (net: string) => INDOOR_FAN_BOARD.testPoints.find((t) => t.net === net)!.id;
const rowOf = (rows: ExpectedReadingRow[], net: string, mode: string) => rows.find((r) => r.red === tpOf(net) && r.mode === mode)!;

describe('demo board library', () => {
  it('lists the outdoor and the indoor demo boards', async () => {
    const r = await tech.get('/api/boards');
    expect(r.status).toBe(200);
    expect((r.body.items as { id: string }[]).map((b) => b.id)).toEqual(expect.arrayContaining(['board-demo-ofd-220', 'board-demo-idf-310']));
  });

  it('serves the indoor board with its picture, fault codes and the computed table', async () => {
    const r = await tech.get('/api/boards/board-demo-idf-310');
    expect(r.status).toBe(200);
    const b = r.body as unknown as BoardDetail;
    // The drawn picture is served from the composition, not carried in the document.
    expect(JSON.stringify(b.document)).not.toContain('<svg');
    const picture = await tech.get(b.pictureUrl!);
    expect(picture.headers.get('content-type')).toMatch(/^image\/svg\+xml/);
    expect(String(picture.body)).toContain('>R405<');
    expect(b.faultCodes.map((f) => f.code)).toEqual(expect.arrayContaining(['E1', 'E2', 'E3']));
    // 15 V rail: the MC7815C output band (onsemi MC7800 series datasheet), its source on the row.
    const v15 = rowOf(b.expectedReadings, 'v15', 'dcv');
    expect([v15.low, v15.high]).toEqual([14.25, 15.75]);
    expect(v15.source).toMatch(/MC7800/);
    // The speed-command load pair: 12k ∥ 6.8k = 4.34 kΩ in circuit (computed; ngspice agrees).
    const pair = rowOf(b.expectedReadings, 'vsp', 'ohm');
    expect(pair.expected as number).toBeCloseTo(4340, -1);
    expect(pair.note).toMatch(/^reads 12k ∥ 6\.8k ≈ 4\.34 kΩ in circuit: parallel path through R405 and R406/);
    // A cold-side point is read against the controller ground.
    expect(rowOf(b.expectedReadings, 'vcc5_c', 'dcv').black).toBe('gnd_c');
  });
});

describe('readings on the indoor board', () => {
  const reading = (value: number) => ({
    idempotencyKey: randomUUID(),
    mode: 'dcv',
    red: tpOf('vcc5_c'),
    black: 'gnd_c',
    power: 'on',
    value,
    raw: String(value),
  });

  it('judges the 5 V rail against the LM7805 band 4.75–5.25 V (LM78xx datasheet, Fairchild DS400018)', async () => {
    const ok = await tech.post(`/api/jobs/${jobId}/readings`, reading(5.2));
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body).toMatchObject({ redNet: 'vcc5_c', blackNet: 'gnd_c', verdict: { verdict: 'ok', low: 4.75, high: 5.25, unit: 'V' } });
    const high = await tech.post(`/api/jobs/${jobId}/readings`, reading(5.4));
    expect(high.body).toMatchObject({ verdict: { verdict: 'high' } });
  });
});

describe('a board composed from templates', () => {
  it('is stored by the admin and gets its expected table', async () => {
    const doc = composeBoard({
      id: `composed-${randomUUID().slice(0, 8)}`,
      slug: 'composed-test',
      name: 'Composed test board',
      family: 'Tests',
      maker: 'Invented',
      width: 500,
      height: 300,
      sections: [{ id: 'reg15', template: 'regulator-15v', base: 200, nets: { out: 'v15' }, region: { x: 10, y: 10, w: 480, h: 280 } }],
    });
    const r = await admin.post('/api/boards', { document: doc });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    const rows = (r.body as unknown as BoardDetail).expectedReadings;
    const v15 = rows.find((x) => x.red === 'TP2' && x.mode === 'dcv')!;
    expect(v15.expected as number).toBeGreaterThanOrEqual(14.25);
    expect(v15.expected as number).toBeLessThanOrEqual(15.75);
  });
});
