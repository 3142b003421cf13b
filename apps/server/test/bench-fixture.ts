// The set-up most bench tests share: a server on the seeded demo database, the demo shop's people signed in, and
// a customer and a board model of the test's own (through the seed's factories), with a job maker on them.
import type { BoardModel } from '@splitscope/contract';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

export interface Bench {
  server: RunningServer;
  admin: Client;
  lead: Client;
  tech: Client;
  trainee: Client;
  customerId: string;
  boardId: string;
  /** A new job on the bench's board for its customer, opened by `createdBy`, assigned to `assigneeId`. */
  newJob(o: { createdBy: string; assigneeId: string }): Promise<string>;
}

export async function startBench(o: { customer: string; document?: BoardModel }): Promise<Bench> {
  const server = await startTestServer();
  const db = server.ctx.db;
  const customerId = (await createCustomer(db, { shopId: 'shop-demo', name: o.customer })).id;
  const boardId = (await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin', document: o.document })).id;
  const as = (role: string) => new Client(server.url).signIn(`${role}@demo.test`);
  const [admin, lead, tech, trainee] = [await as('admin'), await as('lead'), await as('tech'), await as('trainee')];
  const newJob = async ({ createdBy, assigneeId }: { createdBy: string; assigneeId: string }) =>
    (await createJob(db, { shopId: 'shop-demo', createdBy, customerId, boardId, assigneeId })).id;
  return { server, admin, lead, tech, trainee, customerId, boardId, newJob };
}
