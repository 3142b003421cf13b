// A meter's logged readings imported from CSV: the column mapping saved per meter profile, values parsed like the
// reading field, each row bound to a test point, a preview with one clear error per bad row that stores nothing,
// and the import as one idempotent request.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { meterImportResponse, readingListResponse, type MeterImportResult } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let other: Client;
let jobId: string;
let profileId: string;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Import Test Cooling' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  other = await new Client(server.url).signIn('tech@other.test');
}, 120_000);
afterAll(() => server.close());

// An invented bench meter's log: semicolons, a unit column, its own words for the meter function.
const CSV = [
  'Time;Point;Reading;Unit;Function',
  '2026-12-05T09:00:00Z;TP1;14,9;V;DCV', // line 2: good (decimal comma)
  '2026-12-05T09:00:05Z;TP2;7.48;;VOLT:DC', // line 3: good, no unit written
  '2026-12-05T09:00:10Z;TP9;7.5;V;DCV', // line 4: no such test point
  '2026-12-05T09:00:15Z;TP2;banana;;DCV', // line 5: not a reading
  '2026-12-05T09:00:20Z;;7.5;V;DCV', // line 6: no test point: bound by hand below
  '2026-12-05T09:00:25Z;TP2;4k7;;RES', // line 7: Ω with the power on: refused as the bench refuses it
].join('\n');

const body = (over: Record<string, unknown> = {}) => ({ importKey: `imp-${randomUUID()}`, profileId, csv: CSV, ...over });
const readingsOfJob = async () => readingListResponse.parse((await tech.get(`/api/jobs/${jobId}/readings`)).body).items;

describe('CSV import of meter-logged readings', () => {
  it('saves a column mapping per meter profile (the same name replaces it)', async () => {
    const profile = {
      name: `Bench meter ${randomUUID().slice(0, 6)}`,
      mapping: { point: 'Point', value: 'Reading', unit: 'Unit', function: 'Function', time: 'Time' },
      power: 'on',
    };
    const first = await tech.request('PUT', '/api/meter-profiles', { ...profile, mapping: { point: 'TP', value: 'Value' } });
    expect(first.status).toBe(200);
    const saved = await tech.request('PUT', '/api/meter-profiles', profile);
    expect(saved.body).toMatchObject({ id: first.body.id, mapping: profile.mapping, defaultReference: 'gnd' });
    profileId = String(saved.body.id);
  });

  it('previews every row with one clear error per bad row, and stores nothing', async () => {
    const before = (await readingsOfJob()).length;
    const res = await tech.post(`/api/jobs/${jobId}/meter-import/preview`, body());
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const preview = meterImportResponse.parse(res.body);
    const byLine = Object.fromEntries(preview.rows.map((r) => [r.line, r]));
    expect(byLine[2]).toMatchObject({ point: 'TP1', mode: 'dcv', value: 14.9, error: null, takenAt: '2026-12-05T09:00:00.000Z' });
    expect(byLine[3]).toMatchObject({ point: 'TP2', value: 7.48, error: null });
    expect(byLine[4]!.error).toBe('"TP9" is not a test point of this board: bind the row to one');
    expect(byLine[5]!.error).toMatch(/^"banana" is not a reading/);
    expect(byLine[6]!.error).toBe('no test point in column "Point": bind the row to a test point');
    expect(byLine[7]!.error).toMatch(/power/i);
    expect(preview).toMatchObject({ good: 2, bad: 4, stored: 0, columns: ['Time', 'Point', 'Reading', 'Unit', 'Function'] });
    expect((await readingsOfJob()).length).toBe(before);
  });

  it('imports the good rows (and a row bound by hand) once, however often the same import is sent', async () => {
    const before = (await readingsOfJob()).length;
    const request = body({ bindings: { '6': 'tp1' } });
    const [a, b] = await Promise.all([tech.post(`/api/jobs/${jobId}/meter-import`, request), tech.post(`/api/jobs/${jobId}/meter-import`, request)]);
    expect(a.status, JSON.stringify(a.body)).toBe(200);
    expect(b.status, JSON.stringify(b.body)).toBe(200);
    const results = [a.body, b.body].map((x) => meterImportResponse.parse(x) as MeterImportResult);
    expect(results.map((r) => r.good)).toEqual([3, 3]);
    const after = await readingsOfJob();
    expect(after.length).toBe(before + 3);
    const again = meterImportResponse.parse((await tech.post(`/api/jobs/${jobId}/meter-import`, request)).body);
    expect(again.stored).toBe(0);
    expect((await readingsOfJob()).length).toBe(before + 3);
    // Stored as the bench stores a typed reading: the raw text, the verdict against the board, the meter's name.
    const tp2 = after.find((r) => r.raw === '7.48');
    expect(tp2).toMatchObject({ red: 'TP2', mode: 'dcv', value: 7.48, instrument: expect.stringMatching(/^Bench meter/) });
    expect(tp2!.verdict?.verdict).toBe('ok');
  });

  it('says which columns the profile wants when the file has others, and keeps other shops out', async () => {
    const wrong = await tech.post(`/api/jobs/${jobId}/meter-import/preview`, body({ csv: 'When,Where,What\n1,TP1,5' }));
    expect(wrong.status).toBe(422);
    expect(String(wrong.body.detail)).toMatch(/The file has no column "Point", "Reading", "Unit", "Function", "Time".*its columns are "When", "Where", "What"/);
    expect((await other.post(`/api/jobs/${jobId}/meter-import/preview`, body())).status).toBe(404);
  });
});
