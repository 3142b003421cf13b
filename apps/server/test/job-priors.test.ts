// What a job knows before a reading steers its diagnosis, and the answer says why:
// - a fault code's suspect sections raise the priors of their parts (odds form of Bayes' rule, the contract's rule
//   beside FAULT_CODE_WEIGHT), so the ranking before any reading and the first next tests start there;
// - the shop's verified jobs move a part's prior (Dirichlet update, the engine's electrical/history.ts): ten boards
//   of this model whose C8 shorted put C8 first on a new job whose readings cannot tell C8 from C9 and C10.
// Everything runs in a shop of its own, so the history of the demo shop is not touched.
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Diagnosis, FaultCode } from '@splitscope/contract';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import { diagnosisSnapshots, jobs, repairActions } from '../src/db/schema';
import { newId } from '../src/lib/ids';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob, createShop, createUser } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let lead: Client;
let shopId: string;
let customerId: string;
let boardId: string;
let techId: string;
const SUSPECT = new Set(['fan-switch', 'feedback', 'speed-cmd']);
// The screens print a subcircuit part without the netlist's leading X (XU1 is U1 on the board).
const sections = new Map(OUTDOOR_FAN_BOARD.parts.map((p) => [p.designator, p.section]));
const sectionOf = { get: (designator: string) => sections.get(designator) ?? sections.get(`X${designator}`) };
// A next test names its probe nets (`red`, `black`); its labels are the points' descriptions.
const netSection = new Map(OUTDOOR_FAN_BOARD.testPoints.filter((t) => t.net !== '0').map((t) => [t.net.toLowerCase(), t.section]));

const diagnosis = async (jobId: string): Promise<Diagnosis> => {
  const r = await tech.get(`/api/jobs/${jobId}/diagnosis`);
  expect(r.status).toBe(200);
  return r.body as unknown as Diagnosis;
};
const newJob = async (faultCode?: string) =>
  (await createJob(server.ctx.db, { shopId, createdBy: techId, customerId, boardId, ...(faultCode ? { faultCode } : {}) })).id;
const topParts = (d: Diagnosis, n: number) => [...new Set(d.parts.map((p) => p.designator as string))].slice(0, n);

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  shopId = (await createShop(db, { id: `shop-priors-${randomUUID().slice(0, 8)}`, name: 'Priors Test Bench' })).id;
  const suffix = randomUUID().slice(0, 8);
  techId = (await createUser(db, { shopId, role: 'tech', email: `tech-${suffix}@priors.test`, password: 'splitscope-demo' })).id;
  await createUser(db, { shopId, role: 'lead', email: `lead-${suffix}@priors.test`, password: 'splitscope-demo' });
  customerId = (await createCustomer(db, { shopId, name: 'Priors Contracting' })).id;
  boardId = (await createBoardModel(db, { shopId, createdBy: techId, document: OUTDOOR_FAN_BOARD })).id;
  tech = await new Client(server.url).signIn(`tech-${suffix}@priors.test`);
  lead = await new Client(server.url).signIn(`lead-${suffix}@priors.test`);
}, 60_000);
afterAll(async () => {
  await server.close();
});

describe('a fault code steers the ranking before any reading', () => {
  let plain: Diagnosis;
  let coded: Diagnosis;
  let codedJob: string;

  beforeAll(async () => {
    plain = await diagnosis(await newJob());
    codedJob = await newJob('f7');
    coded = await diagnosis(codedJob);
  }, 240_000);

  it('the parts of the suspect sections move up, and nothing moved without a code', () => {
    expect(plain.readings).toHaveLength(0);
    expect(plain.priors).toEqual([]);
    const inSuspect = (d: Diagnosis) => topParts(d, 10).filter((p) => SUSPECT.has(sectionOf.get(p) ?? '')).length;
    expect(inSuspect(coded)).toBeGreaterThan(inSuspect(plain));
    expect(SUSPECT.has(sectionOf.get(topParts(coded, 1)[0] as string) ?? '')).toBe(true);
  });

  it('each moved prior says which code and section moved it, in words', () => {
    const q1 = coded.priors.find((p) => p.designator === 'Q1');
    expect(q1?.steps[0]?.source).toBe('fault-code');
    expect(q1?.steps[0]?.note).toBe(
      'fault code F7 (Outdoor fan motor: no speed feedback after start command (invented code)) points at the Fan supply switch section: ×8',
    );
    expect(q1?.label).toMatch(/^Q1 transistor — /);
    expect(q1!.after).toBeGreaterThan(q1!.before);
    // Parts outside the suspect sections keep their priors.
    expect(coded.priors.every((p) => SUSPECT.has(sectionOf.get(p.designator) ?? ''))).toBe(true);
  });

  it('the next tests start in the suspect sections', () => {
    const firstSuspect = (d: Diagnosis) => d.nextTests.findIndex((t) => [t.red, t.black].some((n) => SUSPECT.has(netSection.get(n.toLowerCase()) ?? '')));
    const coded3 = firstSuspect(coded);
    expect(coded3).toBeGreaterThanOrEqual(0);
    expect(coded3).toBeLessThan(3);
    const plainFirst = firstSuspect(plain);
    expect(plainFirst === -1 || coded3 <= plainFirst).toBe(true);
  });

  it('the shop edits the code: a heavier weight on the switch moves the ranking again', async () => {
    const list = await lead.get(`/api/fault-codes?boardId=${boardId}`);
    const f7 = (list.body as unknown as { items: FaultCode[] }).items.find((c) => c.code === 'F7')!;
    expect(f7.weights).toEqual({ 'fan-switch': 8, feedback: 3, 'speed-cmd': 3 });
    const put = await lead.put(`/api/fault-codes/${f7.id}`, { ...f7, weights: { 'fan-switch': 40, feedback: 1, 'speed-cmd': 1 } });
    expect(put.status).toBe(200);
    const again = await diagnosis(codedJob);
    expect(topParts(again, 5).every((p) => sectionOf.get(p) === 'fan-switch')).toBe(true);
    expect(again.priors.find((p) => p.designator === 'Q1')?.steps[0]?.note).toMatch(/×40$/);
    // A weight below 1 is refused in words.
    const bad = await lead.put(`/api/fault-codes/${f7.id}`, { ...f7, weights: { 'fan-switch': 0.5 } });
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.body)).toContain('A weight is at least 1');
  });
});

describe('ten verified boards whose C8 shorted move C8 on a new job', () => {
  // Dead switched fan rail with a healthy 15 V rail: C8, C9 and C10 shorted all explain it.
  const readings = [
    { mode: 'dcv', red: 'TP3', black: 'gnd', power: 'on', value: 14.98, raw: '14.98' },
    { mode: 'dcv', red: 'TP5', black: 'gnd', power: 'on', value: 0.05, raw: '0.05' },
  ];
  const record = async (jobId: string) => {
    for (const r of readings) expect((await tech.post(`/api/jobs/${jobId}/readings`, { ...r, idempotencyKey: randomUUID() })).status).toBe(201);
  };
  const shortOf = (d: Diagnosis, designator: string) => d.parts.find((p) => p.designator === designator && p.mode === 'short');
  const rankOf = (d: Diagnosis, designator: string) => d.parts.findIndex((p) => p.designator === designator && p.mode === 'short');

  it('C8 goes first, and the screen words say why and how many jobs back it', async () => {
    const db = server.ctx.db;
    const before = await newJob();
    await record(before);
    const plain = await diagnosis(before);
    expect(rankOf(plain, 'C8')).toBeGreaterThan(0);

    for (let i = 0; i < 10; i++) {
      const id = await newJob();
      await db.update(jobs).set({ status: 'verified', proposedPart: 'C8' }).where(eq(jobs.id, id));
      await db.insert(repairActions).values({ id: newId(), shopId, jobId: id, part: 'C8', action: 'replaced', replacementValue: '220u 35V', authorId: techId });
      // What the engine said when the tech proposed C8: its mode is what the history counts.
      await db.insert(diagnosisSnapshots).values({
        id: newId(),
        shopId,
        jobId: id,
        engineVersion: 'test',
        proposedPart: 'C8',
        createdBy: techId,
        output: { parts: [{ part: 'C8', designator: 'C8', mode: 'short', probability: 0.8 }] },
      });
    }

    const after = await newJob();
    await record(after);
    const learned = await diagnosis(after);
    expect(rankOf(learned, 'C8')).toBe(0);
    expect(shortOf(learned, 'C8')!.probability).toBeGreaterThan(shortOf(plain, 'C8')!.probability * 3);
    const why = learned.priors.find((p) => p.designator === 'C8' && p.mode === 'short');
    expect(why?.steps.map((s) => s.source)).toEqual(['history']);
    expect(why?.steps[0]?.note).toBe('C8 capacitor — shorted: 10 of the last 10 verified boards of this model');
    // The same readings, the same engine: only the prior moved.
    expect(learned.readings.map((r) => r.verdict)).toEqual(plain.readings.map((r) => r.verdict));
  }, 240_000);
});
