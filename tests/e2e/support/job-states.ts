import type { JobStatus } from '@splitscope/contract';
import { jobStatuses } from '@splitscope/contract';
import { jobDriver } from '../../../apps/server/src/testing/job-driver';
import { DEMO_BOARD_IDS } from '../../../apps/server/src/testing/requests';
import { apiAs, send } from './divider-job';

/**
 * Jobs of a spec's own on a demo board, one in each status the spec asks for, taken there through the API by the
 * people whose role each step needs (technician, lead): the shared job driver (apps/server/src/testing/job-driver.ts).
 */
export async function jobsInEachStatus(statuses: readonly JobStatus[] = jobStatuses, boardId: string = DEMO_BOARD_IDS.outdoorFan) {
  const people = { tech: await apiAs('tech@demo.test'), lead: await apiAs('lead@demo.test') };
  const driver = await jobDriver((who, method, path, body) => send(people[who], method, path, body), boardId);
  const customer = await send<{ id: string }>(people.tech, 'post', '/customers', {
    name: `Walk Cooling ${crypto.randomUUID().slice(0, 8)}`,
    kind: 'contractor',
  });
  const jobs = new Map<JobStatus, string>();
  for (const status of statuses) jobs.set(status, await driver.jobAt(status, { customerId: customer.id }));
  await Promise.all([people.tech.dispose(), people.lead.dispose()]);
  return jobs;
}
