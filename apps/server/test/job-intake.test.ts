// Intake opens a job once: the same create request sent twice (a double click, a retry) answers the same job.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { RunningServer } from '../src/server';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
beforeAll(async () => {
  server = await startTestServer();
  tech = await new Client(server.url).signIn('tech@demo.test');
}, 120_000);
afterAll(() => server.close());

it('opens one job for two sends of the same intake, at the same moment', async () => {
  const body = {
    idempotencyKey: randomUUID(),
    customerId: 'customer-jun',
    boardId: 'board-demo-ofd-220',
    unitDescription: 'Outdoor unit',
    symptom: 'Fan never starts',
  };
  const [a, b] = await Promise.all([tech.post('/api/jobs', body), tech.post('/api/jobs', body)]);
  expect(a.status, JSON.stringify(a.body)).toBe(201);
  expect(b.status, JSON.stringify(b.body)).toBe(201);
  expect(a.body.id).toBe(b.body.id);
  const other = await tech.post('/api/jobs', { ...body, idempotencyKey: randomUUID() });
  expect(other.body.id).not.toBe(a.body.id);
});
