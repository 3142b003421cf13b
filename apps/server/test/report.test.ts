// The job's flow through moveJob, and the repair report's one model: the web's report, the PDF and the e-mail
// render what GET /api/jobs/:id/report answers, with the verification readings as the sign-off check sees them.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { repairReportSchema, type RepairReport } from '@splitscope/contract';
import { jobs } from '../src/db/schema';
import { moveJob } from '../src/features/jobs/flow';
import { renderReportPdf } from '../src/features/reports';
import { reportLines } from '../src/features/reports/pdf';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';
import { dividerReading } from '../src/testing/requests';

let server: RunningServer;
let tech: Client;
let lead: Client;
let jobId: string;

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Report Test Cooling' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  lead = await new Client(server.url).signIn('lead@demo.test');
});
afterAll(() => server.close());

// The divider board: 15 V over 10k/10k reads about 7.5 V at TP2 (see bench.test.ts for the loading figure).
const statusOf = async () => (await server.ctx.db.select({ s: jobs.status }).from(jobs).where(eq(jobs.id, jobId)))[0]!.s;

describe('job flow and repair report', () => {
  it('moves only along the table: a review decision is refused as an edit, and moveJob refuses a move the table lacks', async () => {
    expect((await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ value: 2.1, raw: '2.1' }))).status).toBe(201);
    expect(await statusOf()).toBe('diagnosing');
    expect((await tech.patch(`/api/jobs/${jobId}`, { status: 'awaiting-review', proposedPart: 'R2' })).status).toBe(200);
    const asEdit = await lead.patch(`/api/jobs/${jobId}`, { status: 'approved' });
    expect(asEdit.status).toBe(409);
    expect(String(asEdit.body.detail)).toMatch(/review decision/);
    await expect(
      moveJob(server.ctx.db, { jobId, shopId: 'shop-demo', from: 'awaiting-review', to: 'returned', by: { event: 'quote-approval' } }),
    ).rejects.toThrow(/cannot move/);
    expect(await statusOf()).toBe('awaiting-review');
    expect((await lead.post(`/api/jobs/${jobId}/reviews`, { decision: 'approve', comment: 'R2 open' })).status).toBe(201);
    expect(await statusOf()).toBe('approved');
  }, 120_000); // proposing runs the first diagnosis of this board: seconds of engine work on a busy machine

  it('leaves a corrected verification reading out of the sign-off, the report and the PDF', async () => {
    expect((await tech.post(`/api/jobs/${jobId}/repairs`, { part: 'R2', action: 'replaced', replacementValue: '10k' })).status).toBe(201);
    const typo = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ phase: 'verification', value: 75, raw: '75' }));
    expect(typo.body).toMatchObject({ verdict: { verdict: 'high' } });
    const fix = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ phase: 'verification', supersedes: String(typo.body.id) }));
    expect(fix.body).toMatchObject({ verdict: { verdict: 'ok' } });
    // The sign-off checklist also asks for the rail that feeds the divider (TP1, 15 V).
    const rail = await tech.post(`/api/jobs/${jobId}/readings`, dividerReading({ phase: 'verification', red: 'TP1', value: 15, raw: '15' }));
    expect(rail.body).toMatchObject({ verdict: { verdict: 'ok' } });
    expect((await tech.patch(`/api/jobs/${jobId}`, { status: 'repaired' })).status).toBe(200);
    // the sign-off judges the correction, not the typo it replaced
    const signOff = await lead.patch(`/api/jobs/${jobId}`, { status: 'verified', functionalCheckDone: true });
    expect(signOff.status, JSON.stringify(signOff.body)).toBe(200);

    const res = await tech.get(`/api/jobs/${jobId}/report`);
    expect(res.status).toBe(200);
    const report: RepairReport = repairReportSchema.parse(res.body);
    expect(report.verification.map((r) => r.id).sort()).toEqual([fix.body.id, rail.body.id].sort());
    expect(report).toMatchObject({ verified: true, finding: { part: 'R2', reviewedBy: expect.any(String) }, repairs: [{ part: 'R2' }] });
    expect(report.foundBy.map((r) => r.raw)).toEqual(['2.1']);

    const drawn = reportLines(report).map((l) => l.text);
    // Probe positions, meter function and board state in the bench's words, not net names or mode ids.
    expect(drawn.find((l) => l.startsWith('• TP2'))).toMatch(/^• TP2 .* to bus negative.* \(DC V, powered\): 7\.5 \(healthy\)$/);
    expect(drawn.join('\n')).not.toMatch(/\b75\b/);
    const pdf = await renderReportPdf(report);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });
});
