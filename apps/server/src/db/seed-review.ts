// A demo job waiting for the lead: the tech found the switched fan rail dead with a healthy 15 V source,
// heard the rail beep to ground unpowered, lifted C9 and read the rail healthy, and proposed C9. The readings
// go through the same service as the bench, so their verdicts and the snapshot are the engine's.
import { eq } from 'drizzle-orm';
import type { CreateReadingRequest } from '@splitscope/contract';
import { createReadingRequest } from '@splitscope/contract';
import type { Actor } from '../auth/guards';
import { createReading } from '../features/readings/service';
import { updateJob } from '../features/jobs/service';
import type { Db } from './client';
import { jobs } from './schema';
import { createJob } from '../testing/factories';
import { DEMO_BOARD_IDS } from '../testing/requests';

export const REVIEW_JOB_ID = 'job-demo-fan-4';

const TECH: Actor = { id: 'user-tech', email: 'tech@demo.test', name: 'Priya Nair', role: 'tech', shopId: 'shop-demo' };

/** What the tech measured on the demo board (TP3 = 15 V rail, TP5 = switched fan rail). Invented demo data. */
const READINGS: (Omit<CreateReadingRequest, 'idempotencyKey'> & { key: string })[] = [
  { key: 'seed-review-1', mode: 'dcv', red: 'TP3', black: '0', power: 'on', value: 14.98, raw: '14.98' },
  { key: 'seed-review-2', mode: 'dcv', red: 'TP5', black: '0', power: 'on', value: 0.05, raw: '0.05' },
  {
    key: 'seed-review-3',
    mode: 'continuity',
    red: 'TP5',
    black: '0',
    power: 'off',
    value: 0.4,
    beep: true,
    raw: '0.4',
    safetyCheck: { unplugged: true, busVolts: 3.1 },
  },
  {
    key: 'seed-review-4',
    mode: 'ohm',
    red: 'TP5',
    black: '0',
    power: 'off',
    lifted: ['C9'],
    value: 1310,
    raw: '1.31k',
    safetyCheck: { unplugged: true, busVolts: 1.8 },
  },
];

export async function seedReviewJob(db: Db): Promise<void> {
  const [exists] = await db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, REVIEW_JOB_ID));
  if (exists && exists.status !== 'received' && exists.status !== 'diagnosing') return;
  await createJob(db, {
    id: REVIEW_JOB_ID,
    shopId: 'shop-demo',
    createdBy: 'user-tech',
    boardId: DEMO_BOARD_IDS.outdoorFan,
    customerId: 'customer-northgate',
    faultCode: 'F7',
    unitDescription: 'Outdoor unit, 7 kW heat pump',
    serial: 'DEMO-0004',
    symptom: 'Outdoor fan never starts; F7 after two minutes',
    assigneeId: 'user-tech',
  });
  // Idempotency keys make a half-finished earlier seed safe to run again.
  for (const { key, ...r } of READINGS)
    await createReading({ db, actor: TECH, jobId: REVIEW_JOB_ID, input: createReadingRequest.parse({ ...r, idempotencyKey: key }) });
  await updateJob({ db, actor: TECH, id: REVIEW_JOB_ID, input: { status: 'awaiting-review', proposedPart: 'C9' } });
}
