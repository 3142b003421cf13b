// The typed board model end to end: create requests are checked against the board-model schema, part kinds and
// priors of a stored board reach the diagnosis engine, version 1 documents are upgraded at start (an inline photo
// becomes an upload), and a job keeps the version its readings were taken on when the board gets a new one.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BOARD_MODEL_SCHEMA_VERSION, type BoardDetail, type BoardModel, type Diagnosis } from '@splitscope/contract';
import { boardModels, boardModelVersions } from '../src/db/schema';
import { upgradeBoardDocuments } from '../src/features/boards/upgrade';
import type { RunningServer } from '../src/server';
import { createCustomer, createJob, DIVIDER_BOARD } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let admin: Client;
let tech: Client;
let customerId: string;

beforeAll(async () => {
  server = await startTestServer();
  customerId = (await createCustomer(server.ctx.db, { shopId: 'shop-demo', name: 'Board Model Test Customer' })).id;
  admin = await new Client(server.url).signIn('admin@demo.test');
  tech = await new Client(server.url).signIn('tech@demo.test');
}, 120_000);
afterAll(() => server.close());

/** The divider board with two 22 µF capacitors across the rail: one ceramic, one electrolytic, and R1's own prior. */
function capacitorBoard(): BoardModel {
  const key = `caps-${randomUUID().slice(0, 8)}`;
  const cap = (designator: string, kind: BoardModel['parts'][number]['kind'], x: number) => ({
    designator,
    element: designator,
    kind,
    value: '22u',
    package: '1206',
    x,
    y: 200,
    rotation: 0,
    section: 'div',
    pins: [
      { pin: '1', net: 'in' },
      { pin: '2', net: '0' },
    ],
  });
  return {
    ...DIVIDER_BOARD,
    id: key,
    slug: key,
    name: `Capacitor kinds ${key}`,
    netlist: '* invented test board\nVS in 0 DC 15\nR1 in mid 10k\nR2 mid 0 10k\nC1 in 0 22u\nC2 in 0 22u\n.end\n',
    parts: [
      { ...DIVIDER_BOARD.parts[0]!, priors: { open: 0.05 } },
      DIVIDER_BOARD.parts[1]!,
      cap('C1', 'ceramic-capacitor', 100),
      cap('C2', 'electrolytic-capacitor', 200),
    ],
  };
}

describe('board documents are board models', () => {
  it('refuses a create request whose document is not a board model, naming the field', async () => {
    const old = {
      ...DIVIDER_BOARD,
      id: 'old-form',
      schemaVersion: 1,
      picture: { url: `data:image/png;base64,${'A'.repeat(30_000)}`, width: 10, height: 10, units: 'px' },
    };
    const r = await admin.post('/api/boards', { document: old });
    expect(r.status).toBe(422);
    expect(JSON.stringify(r.body)).toMatch(/document\.schemaVersion/);
  });

  it('refuses absurd part values, ratings and positions with a 422 that names the field and the range', async () => {
    const base = capacitorBoard();
    const part0 = base.parts[0]!;
    const cases: [string, BoardModel, RegExp][] = [
      ['part value 1e308', { ...base, parts: [{ ...part0, nominal: 1e308 }, ...base.parts.slice(1)] }, /parts\.0\.nominal.*at most 1000000000/],
      ['negative rating', { ...base, parts: [{ ...part0, params: { ctr: -1e12 } }, ...base.parts.slice(1)] }, /parts\.0\.params\.ctr.*at least -1000000000/],
      ['position 1e300', { ...base, parts: [{ ...part0, x: 1e300 }, ...base.parts.slice(1)] }, /parts\.0\.x.*position on the board picture/],
      ['picture 0 wide', { ...base, picture: { ...base.picture, width: 0 } }, /picture\.width.*at least 1/],
      ['.param 1e100', { ...base, params: { DUTY: 1e100 } }, /params\.DUTY/],
    ];
    for (const [what, doc, words] of cases) {
      const r = await admin.post('/api/boards', { document: doc });
      expect(r.status, what).toBe(422);
      expect(JSON.stringify(r.body), what).toMatch(words);
    }
    // the same board within the ranges is stored
    expect((await admin.post('/api/boards', { document: base })).status).toBe(201);
  });

  it('gives a ceramic capacitor the ceramic priors and a part its own prior, before any reading', async () => {
    const created = await admin.post('/api/boards', { document: capacitorBoard() });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const board = created.body as unknown as BoardDetail;
    expect(board.document.parts.find((p) => p.designator === 'C1')?.kind).toBe('ceramic-capacitor');
    const job = await createJob(server.ctx.db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId, boardId: board.id });
    const r = await tech.get(`/api/jobs/${job.id}/diagnosis`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const parts = (r.body as unknown as Diagnosis).parts;
    const p = (part: string, mode: string) => parts.find((x) => x.part === part && x.mode === mode)?.probability ?? 0;
    // Default priors (packages/diagnosis kinds.ts): ceramic short 0.004, leaky 0.001; electrolytic short 0.002,
    // leaky 0.003. By value alone the engine would take a 22 µF capacitor for an electrolytic.
    expect(p('C1', 'short') / p('C2', 'short')).toBeCloseTo(0.004 / 0.002, 6);
    expect(p('C1', 'leaky') / p('C2', 'leaky')).toBeCloseTo(0.001 / 0.003, 6);
    // R1's own open prior (0.05) against the resistor default (0.003); the engine reports 4 significant digits.
    expect(p('R1', 'open') / p('R2', 'open') / (0.05 / 0.003)).toBeCloseTo(1, 2);
    expect(parts[0]).toMatchObject({ part: 'R1', mode: 'open' });
  }, 120_000);
});

describe('start-time upgrade of version 1 documents', () => {
  // A 1×1 PNG (the signature is what the upload check reads).
  const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64');

  it('moves an inline photo into an upload and document priors onto the parts', async () => {
    const db = server.ctx.db;
    const id = `v1-${randomUUID().slice(0, 8)}`;
    const { picture: _picture, parts, ...rest } = DIVIDER_BOARD;
    const v1 = {
      ...rest,
      id,
      slug: id,
      schemaVersion: 1,
      picture: { url: `data:image/png;base64,${PNG.toString('base64')}`, width: 1, height: 1, units: 'px' },
      parts: parts.map(({ priors: _p, ...q }) => q),
      priors: { R2: { open: 0.02 } },
    };
    await db.insert(boardModels).values({ id, shopId: 'shop-demo', key: id, name: 'Version 1 board', currentVersion: 1 });
    await db.insert(boardModelVersions).values({ id: `${id}-v1`, boardId: id, version: 1, document: v1, expectedReadings: [], createdBy: 'user-admin' });

    const outcome = await upgradeBoardDocuments(server.ctx);
    expect(outcome.failed.filter((f) => f.versionId === `${id}-v1`)).toEqual([]);
    const r = await tech.get(`/api/boards/${id}`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const b = r.body as unknown as BoardDetail;
    expect(b.document.schemaVersion).toBe(BOARD_MODEL_SCHEMA_VERSION);
    expect(b.document.parts.find((p) => p.designator === 'R2')?.priors).toEqual({ open: 0.02 });
    expect(b.pictureUrl).toBe(`/api/uploads/${b.document.picture.uploadId}`);
    const bytes = await fetch(server.url + b.pictureUrl, { headers: { cookie: tech.cookie } });
    expect(Buffer.from(await bytes.arrayBuffer()).equals(PNG)).toBe(true);
    // A second start finds nothing left to upgrade.
    expect((await upgradeBoardDocuments(server.ctx)).upgraded).toBe(0);
  });

  it('reads a version 1 document stored after start-up: the job page and its diagnosis answer, the photo waits', async () => {
    const db = server.ctx.db;
    const id = `v1-late-${randomUUID().slice(0, 8)}`;
    const { picture: _picture, parts, ...rest } = DIVIDER_BOARD;
    const v1 = {
      ...rest,
      id,
      slug: id,
      schemaVersion: 1,
      picture: { url: `data:image/png;base64,${PNG.toString('base64')}`, width: 1, height: 1, units: 'px' },
      parts: parts.map(({ priors: _p, ...q }) => q),
      priors: { R2: { open: 0.02 } },
    };
    await db.insert(boardModels).values({ id, shopId: 'shop-demo', key: id, name: 'Late version 1 board', currentVersion: 1 });
    await db.insert(boardModelVersions).values({ id: `${id}-v1`, boardId: id, version: 1, document: v1, expectedReadings: [], createdBy: 'user-admin' });
    const job = await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId, boardId: id });

    const page = await tech.get(`/api/jobs/${job.id}`);
    expect(page.status, JSON.stringify(page.body)).toBe(200);
    const board = await tech.get(`/api/boards/${id}`);
    expect(board.status, JSON.stringify(board.body)).toBe(200);
    const b = board.body as unknown as BoardDetail;
    expect(b.document.parts.find((p) => p.designator === 'R2')?.priors).toEqual({ open: 0.02 });
    // The inline photo is stored by the next start-up step, not by a read.
    expect(b.pictureUrl ?? 'none').not.toMatch(/^\/api\/uploads\//);
    expect((await tech.get(`/api/jobs/${job.id}/diagnosis`)).status).toBe(200);
  }, 120_000);
});

describe('versions', () => {
  it('keeps a job and its readings on the version they were taken on when the board gets a new one', async () => {
    const doc = capacitorBoard();
    const board = (await admin.post('/api/boards', { document: doc })).body as unknown as BoardDetail;
    const job = await createJob(server.ctx.db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId, boardId: board.id });
    const taken = await tech.post(`/api/jobs/${job.id}/readings`, {
      idempotencyKey: randomUUID(),
      mode: 'dcv',
      red: 'TP2',
      black: '0',
      power: 'on',
      value: 7.5,
      raw: '7.5',
    });
    expect(taken.status, JSON.stringify(taken.body)).toBe(201);
    // Version 2 halves the top resistor: the divider would read 10 V.
    const next = await admin.patch(`/api/boards/${board.id}`, { document: { ...doc, netlist: doc.netlist.replace('R1 in mid 10k', 'R1 in mid 5k') } });
    expect(next.status, JSON.stringify(next.body)).toBe(200);
    expect((next.body as unknown as BoardDetail).version).toBe(2);
    const detail = (await tech.get(`/api/jobs/${job.id}`)).body as unknown as { board: BoardDetail; boardVersion: number };
    expect(detail.boardVersion).toBe(1);
    expect(detail.board.document.netlist).toContain('R1 in mid 10k');
    const readings = (await tech.get(`/api/jobs/${job.id}/readings`)).body as unknown as { items: { verdict: { verdict: string; expected: number } }[] };
    // 7.5 V less the meter's 10 MΩ load on the 5 kΩ divider output: the version 1 value, not version 2's 10 V.
    expect(readings.items[0]!.verdict.verdict).toBe('ok');
    expect(readings.items[0]!.verdict.expected).toBeCloseTo(7.5, 1);
  }, 120_000);
});
