import type { BoardDetail, ExpectedReadingRow, JobStatus } from '@splitscope/contract';
import { jobStatuses, verificationChecklist } from '@splitscope/contract';
import { DEMO_BOARD_IDS, readingRequest } from '../../../apps/server/src/testing/requests';
import { apiAs, send } from './divider-job';

/**
 * Jobs of a spec's own on a demo board, one in each status the spec asks for, taken there through the API by the
 * people whose role each step needs (technician, lead). Verification readings are the board's own expected
 * values for the checklist the contract draws for the repaired part (`verificationChecklist`), so the sign-off
 * passes the same check a lead's does. Unpowered readings pass the discharge gate with a discharged bus (1.2 V).
 */
export async function jobsInEachStatus(statuses: readonly JobStatus[] = jobStatuses, boardId: string = DEMO_BOARD_IDS.outdoorFan) {
  const tech = await apiAs('tech@demo.test');
  const lead = await apiAs('lead@demo.test');
  const board = await send<BoardDetail>(tech, 'get', `/boards/${boardId}`);
  const part = board.document.parts.find((p) => p.kind.endsWith('capacitor')) ?? board.document.parts[0]!;
  const customer = await send<{ id: string }>(tech, 'post', '/customers', { name: `Walk Cooling ${crypto.randomUUID().slice(0, 8)}`, kind: 'contractor' });
  const healthy = (r: ExpectedReadingRow, phase: 'diagnosis' | 'verification') =>
    readingRequest({
      mode: r.mode,
      red: r.red,
      black: r.black,
      power: r.power,
      // The checklist and the first test are DC V and Ω rows: a number, or OL for an open circuit.
      value: typeof r.expected === 'number' ? r.expected : 'OL',
      raw: typeof r.expected === 'number' ? String(r.expected) : 'OL',
      ...(r.power === 'off' ? { safetyCheck: { unplugged: true as const, busVolts: 1.2 } } : {}),
      phase,
    });
  const first = board.expectedReadings.find((r) => r.mode === 'dcv' && r.power === 'on' && r.lifted.length === 0)!;
  const checklist = verificationChecklist(board.document, board.expectedReadings, part.designator).rows;

  const steps: [JobStatus, (id: string) => Promise<unknown>][] = [
    ['diagnosing', (id) => send(tech, 'post', `/jobs/${id}/readings`, healthy(first, 'diagnosis'))],
    ['awaiting-review', (id) => send(tech, 'patch', `/jobs/${id}`, { status: 'awaiting-review', proposedPart: part.designator })],
    ['approved', (id) => send(lead, 'post', `/jobs/${id}/reviews`, { decision: 'approve', comment: `${part.designator} as proposed` })],
    [
      'repaired',
      async (id) => {
        await send(tech, 'post', `/jobs/${id}/repairs`, { part: part.designator, action: 'replaced', replacementValue: part.value });
        for (const r of checklist) await send(tech, 'post', `/jobs/${id}/readings`, healthy(r, 'verification'));
        await send(tech, 'patch', `/jobs/${id}`, { status: 'repaired' });
      },
    ],
    ['verified', (id) => send(lead, 'patch', `/jobs/${id}`, { status: 'verified', functionalCheckDone: true })],
    ['returned', (id) => send(tech, 'patch', `/jobs/${id}`, { status: 'returned', returnedVia: 'courier' })],
  ];
  const jobs = new Map<JobStatus, string>();
  for (const status of statuses) {
    const job = await send<{ id: string }>(tech, 'post', '/jobs', {
      customerId: customer.id,
      boardId,
      unitDescription: 'Outdoor unit',
      symptom: 'Fan never starts',
    });
    // steps[i] takes a job into the status after jobStatuses[i]: a job in status s has taken the steps before it.
    for (const [, step] of steps.slice(0, jobStatuses.indexOf(status))) await step(job.id);
    jobs.set(status, job.id);
  }
  await Promise.all([tech.dispose(), lead.dispose()]);
  return jobs;
}
