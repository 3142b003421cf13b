// A board not in the library, end to end over the API: taken in with its photo, readings recorded on points marked
// on the photo (not judged), a draft of its model marked from templates (expected values computed, nothing
// published), the model published by a lead, and a second job on it judged and ranked.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { BoardCaptureInput, BoardDetail, BoardDraft, Diagnosis } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createCustomer } from '../src/testing/factories';
import { Client, startTestServer } from './harness';
import { TINY_PNG } from './pictures';

let server: RunningServer;
let tech: Client;
let lead: Client;
let customerId: string;
let photoId: string;
let boardId: string;
let firstJob: string;

beforeAll(async () => {
  server = await startTestServer();
  customerId = (await createCustomer(server.ctx.db, { shopId: 'shop-demo', name: 'Capture Test Contracting' })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  lead = await new Client(server.url).signIn('lead@demo.test');
  const png = TINY_PNG;
  const up = await fetch(`${server.url}/api/uploads`, { method: 'POST', headers: { cookie: tech.cookie, 'content-type': 'image/png' }, body: png });
  photoId = ((await up.json()) as { id: string }).id;
}, 120_000);
afterAll(() => server.close());

const openJob = async () => {
  const r = await tech.post('/api/jobs', { customerId, unitDescription: 'Wall unit, indoor', boardId, symptom: 'Fan never starts' });
  expect(r.status).toBe(201);
  return (r.body as unknown as { id: string }).id;
};
const read = (jobId: string, red: string, value: number, extra: Record<string, unknown> = {}) =>
  tech.post(`/api/jobs/${jobId}/readings`, { idempotencyKey: randomUUID(), mode: 'dcv', red, black: 'gnd', power: 'on', value, raw: String(value), ...extra });
const saveDraft = (capture: BoardCaptureInput) => tech.request('PUT', `/api/boards/${boardId}/draft`, { capture });

const photo = () => ({ uploadId: photoId, width: 2000, height: 1500 });
const points = [
  { id: 'TP1', label: 'Bus +', x: 120, y: 80, net: 'vbus' },
  { id: 'TP2', x: 180, y: 90, net: 'bus_mid' },
  { id: 'TP3', x: 450, y: 60, net: 'reg15_vin' },
  { id: 'TP4', label: '15 V', x: 520, y: 60, net: 'v15' },
  { id: 'TP5', x: 60, y: 450, net: 'v15sw' },
  { id: 'TP6', x: 90, y: 470, net: 'fan-switch_b' },
];
const region = (x: number, y: number) => ({ x, y, w: 300, h: 200 });
const sections: NonNullable<BoardCaptureInput['sections']> = [
  {
    id: 'bus',
    template: 'dc-bus',
    base: 100,
    region: region(0, 0),
    nets: { bus: 'vbus' },
    params: { mainsRms: 230 },
    values: { C101: 470e-6 },
    markings: { C101: '470µF 400V' },
  },
  { id: 'reg15', template: 'regulator-15v', base: 200, region: region(400, 0), nets: { out: 'v15' } },
  {
    id: 'fan-switch',
    template: 'fan-switch',
    base: 300,
    region: region(0, 400),
    nets: { in: 'v15', out: 'v15sw' },
    values: { R303: 10e3 },
    markings: { R303: '103' },
  },
];

describe('a board not in the library', () => {
  it('is taken in with its photo and maker/model text; a job opens on it with nothing to judge', async () => {
    const r = await tech.post('/api/boards/unlisted', { maker: 'Invented Maker', model: 'XY-9 indoor', photo: photo() });
    expect(r.status).toBe(201);
    const b = r.body as unknown as BoardDetail;
    boardId = b.id;
    expect(b.name).toBe('Invented Maker XY-9 indoor');
    expect(b.pictureUrl).toBe(`/api/uploads/${photoId}`);
    expect([b.document.testPoints.length, b.document.sections.length, b.expectedReadings.length]).toEqual([0, 0, 0]);
    firstJob = await openJob();
    expect((await tech.get(`/api/jobs/${firstJob}`)).status).toBe(200);
  });

  it('records readings on points marked on the photo without a verdict; unpowered ones wait for the discharge gate', async () => {
    const d = await saveDraft({ photo: photo(), points: points.slice(0, 2).map(({ net: _net, ...p }) => p) });
    expect(d.status).toBe(200);
    expect((d.body as unknown as BoardDraft).points.map((p) => p.unmodelled)).toEqual([
      'no section is marked on this board yet',
      'no section is marked on this board yet',
    ]);
    const r = await read(firstJob, 'TP1', 312.4);
    expect(r.status).toBe(201);
    expect(r.body.verdict).toBeNull();
    expect((await read(firstJob, 'TP9', 1)).status).toBe(422);
    const off = await tech.post(`/api/jobs/${firstJob}/readings`, {
      idempotencyKey: randomUUID(),
      mode: 'ohm',
      red: 'TP2',
      black: 'gnd',
      power: 'off',
      value: 1000,
      raw: '1k',
    });
    expect(off.status).toBe(422);
    expect(JSON.stringify(off.body)).toMatch(/unplugged/);
    const dx = await tech.get(`/api/jobs/${firstJob}/diagnosis`);
    expect(dx.status).toBe(200);
    expect((dx.body as unknown as Diagnosis).parts).toEqual([]);
  }, 120_000);

  it('a saved draft has the engine compute every point on a modelled net, without publishing', async () => {
    const r = await saveDraft({ photo: photo(), points: [...points, { id: 'TP7', x: 900, y: 900 }], sections });
    expect(r.status).toBe(200);
    const d = r.body as unknown as BoardDraft;
    expect(d.problem).toBeNull();
    const v15 = d.points.find((p) => p.id === 'TP4')!.expected.find((e) => e.mode === 'dcv' && e.power === 'on')!;
    // MC7815C output band 14.25–15.75 V (onsemi MC7800 series datasheet), with its source.
    expect(v15.expected as number).toBeGreaterThanOrEqual(14.25);
    expect(v15.expected as number).toBeLessThanOrEqual(15.75);
    expect(v15.source).toMatch(/MC7800/);
    expect(d.points.find((p) => p.id === 'TP7')!.unmodelled).toBe('no net named for this point');
    expect(d.nets.map((n) => n.name)).toEqual(expect.arrayContaining(['vbus', 'v15', 'v15sw']));
    const board = (await tech.get(`/api/boards/${boardId}`)).body as unknown as BoardDetail;
    expect(board.version).toBe(1);
  });

  it("publishing is a lead's; it makes version 2 and a second job on it gets verdicts and a ranking", async () => {
    expect((await tech.post(`/api/boards/${boardId}/publish`, {})).status).toBe(403);
    const p = await lead.post(`/api/boards/${boardId}/publish`, {});
    expect(p.status).toBe(201);
    const b = p.body as unknown as BoardDetail;
    expect(b.version).toBe(2);
    expect(b.document.testPoints.map((t) => t.id)).toEqual(['TP1', 'TP2', 'TP3', 'TP4', 'TP5', 'TP6']);
    const second = await openJob();
    const ok = await read(second, 'TP4', 15.0);
    expect(ok.status).toBe(201);
    expect((ok.body.verdict as { verdict: string }).verdict).toBe('ok');
    const low = await read(second, 'TP5', 0.4);
    expect((low.body.verdict as { verdict: string }).verdict).toBe('low');
    const dx = (await tech.get(`/api/jobs/${second}/diagnosis`)).body as unknown as Diagnosis;
    expect(dx.parts.length).toBeGreaterThan(0);
    // The first job stays on the version its readings were taken on.
    const first = (await tech.get(`/api/jobs/${firstJob}`)).body as unknown as { boardVersion: number };
    expect(first.boardVersion).toBe(1);
  }, 120_000);
});
