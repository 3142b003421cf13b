// One way for a test to take a job through its statuses: over the API, each step by the role the shop's rules
// name (a technician takes the readings, proposes and repairs; a lead approves and signs off), never by writing a
// status. The browser specs (Playwright's request context) and the fuzzer (fetch) each pass their own `ApiCall`.
// Pure values and contract rules only, so a browser spec can import it without loading the server.
import type { BoardDetail, ExpectedReadingRow, JobStatus } from '@splitscope/contract';
import { jobStatuses, verificationChecklist } from '@splitscope/contract';
import { readingRequest } from './requests';

/** Who takes a step: the technician at the bench or the lead who reviews and signs off. */
type DriverRole = 'tech' | 'lead';

/** A call of the API as that person; `path` is after `/api` (`/jobs/…`). Answers the parsed JSON, throws on a refusal. */
type ApiCall = (who: DriverRole, method: 'get' | 'post' | 'patch', path: string, body?: unknown) => Promise<unknown>;

/** The board's healthy value for one expected-table row as a reading (unpowered rows with the bus discharged, 1.2 V). */
export function healthyReading(r: ExpectedReadingRow, phase: 'diagnosis' | 'verification') {
  return readingRequest({
    mode: r.mode,
    red: r.red,
    black: r.black,
    power: r.power,
    lifted: r.lifted,
    // The checklist and the first test are DC V and Ω rows: a number, or OL for an open circuit.
    value: typeof r.expected === 'number' ? r.expected : 'OL',
    raw: typeof r.expected === 'number' ? String(r.expected) : 'OL',
    ...(r.power === 'off' ? { safetyCheck: { unplugged: true as const, busVolts: 1.2 } } : {}),
    phase,
  });
}

/**
 * A driver for jobs on one board model. The proposed and repaired part is the board's first capacitor; the
 * verification readings are the board's own expected values for the checklist the contract draws for that part
 * (`verificationChecklist`), so the sign-off passes the same check a lead's does.
 */
export async function jobDriver(call: ApiCall, boardId: string) {
  const board = (await call('tech', 'get', `/boards/${boardId}`)) as BoardDetail;
  const part = board.document.parts.find((p) => p.kind.endsWith('capacitor')) ?? board.document.parts[0]!;
  const first = board.expectedReadings.find((r) => r.mode === 'dcv' && r.power === 'on' && r.lifted.length === 0)!;
  const checklist = verificationChecklist(board.document, board.expectedReadings, part.designator).rows;

  // steps[s] takes a job into status s from the status before it in `jobStatuses`.
  const steps: Partial<Record<JobStatus, (id: string) => Promise<unknown>>> = {
    // the first reading starts the diagnosis of a received job
    diagnosing: (id) => call('tech', 'post', `/jobs/${id}/readings`, healthyReading(first, 'diagnosis')),
    'awaiting-review': (id) => call('tech', 'patch', `/jobs/${id}`, { status: 'awaiting-review', proposedPart: part.designator }),
    // the proposer does not approve their own proposal (the shop's duty rules): the lead does
    approved: (id) => call('lead', 'post', `/jobs/${id}/reviews`, { decision: 'approve', comment: `${part.designator} as proposed` }),
    repaired: async (id) => {
      await call('tech', 'post', `/jobs/${id}/repairs`, { part: part.designator, action: 'replaced', replacementValue: part.value });
      for (const r of checklist) await call('tech', 'post', `/jobs/${id}/readings`, healthyReading(r, 'verification'));
      await call('tech', 'patch', `/jobs/${id}`, { status: 'repaired' });
    },
    verified: (id) => call('lead', 'patch', `/jobs/${id}`, { status: 'verified', functionalCheckDone: true }),
    returned: (id) => call('tech', 'patch', `/jobs/${id}`, { status: 'returned', returnedVia: 'courier' }),
  };

  /** Takes job `id` from status `from` to the later status `to`, one step at a time. */
  async function advance(id: string, from: JobStatus, to: JobStatus): Promise<void> {
    for (const status of jobStatuses.slice(jobStatuses.indexOf(from) + 1, jobStatuses.indexOf(to) + 1)) await steps[status]!(id);
  }

  /** A new job of the customer on this board, taken from received to `status`: its id. */
  async function jobAt(status: JobStatus, job: { customerId: string; unitDescription?: string; symptom?: string }): Promise<string> {
    const made = (await call('tech', 'post', '/jobs', {
      boardId,
      unitDescription: job.unitDescription ?? 'Outdoor unit',
      symptom: job.symptom ?? 'Fan never starts',
      customerId: job.customerId,
    })) as { id: string };
    await advance(made.id, 'received', status);
    return made.id;
  }

  return { board, part, advance, jobAt };
}
