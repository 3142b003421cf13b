import { randomUUID } from 'node:crypto';
import { request, type APIRequestContext } from '@playwright/test';
import { DIVIDER_BOARD } from '../../../apps/server/src/testing/boards';
import { readingRequest } from '../../../apps/server/src/testing/requests';
import { DEMO_PASSWORD, expect } from '../fixtures';
import type { TestShop } from './own-shop';

/**
 * A job of a spec's own on an invented divider board, taken through the flow by the people whose role each step
 * needs (technician, lead, admin), each with an API session beside the browser's. See support/shop-data.ts for
 * single-user helpers on the demo boards.
 */

/** An API session of one demo person, beside the browser's (the spec's own data goes in through it). */
export async function apiAs(email: string): Promise<APIRequestContext> {
  const ctx = await request.newContext({ baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:5180' });
  const res = await ctx.post('/api/auth/sign-in', { data: { email, password: DEMO_PASSWORD } });
  expect(res.status(), `sign-in as ${email}`).toBe(204);
  return ctx;
}

export async function send<T = Record<string, unknown>>(ctx: APIRequestContext, method: 'post' | 'patch' | 'get', path: string, data?: unknown): Promise<T> {
  const res = await ctx[method](`/api${path}`, data === undefined ? undefined : { data });
  expect(res.ok(), `${method.toUpperCase()} ${path} → ${res.status()} ${await res.text()}`).toBe(true);
  return (await res.json()) as T;
}

/** The shared invented divider board (TP1 15 V rail, TP2 divider) under a key and name of the spec's own. */
export function dividerBoard(tag: string) {
  return { ...DIVIDER_BOARD, id: `e2e-divider-${tag}`, slug: `e2e-divider-${tag}`, name: `Divider test board ${tag}` };
}

/** The spec's own board model and customer, in the spec's shop (support/own-shop.ts). */
export async function benchSetup(shop: TestShop) {
  const tag = randomUUID().slice(0, 8);
  const admin = await apiAs(shop.users.admin.email);
  const tech = await apiAs(shop.users.tech.email);
  const lead = await apiAs(shop.users.lead.email);
  const board = await send<{ id: string }>(admin, 'post', '/boards', { document: dividerBoard(tag) });
  const customer = await send<{ id: string }>(tech, 'post', '/customers', { name: `Spec Cooling ${tag}`, kind: 'contractor' });
  return { tag, admin, tech, lead, boardId: board.id, customerId: customer.id };
}

type Setup = Awaited<ReturnType<typeof benchSetup>>;
const reading = (o: { value: number; raw: string; phase?: 'verification'; red?: string }) =>
  readingRequest({ mode: 'dcv', red: 'TP2', black: 'gnd', power: 'on', ...o });

/** A job on the spec's board taken to approved: R2 found (TP2 reads 2.1 V instead of 7.5 V), the lead approves. */
export async function approvedJob(s: Setup, extra: Record<string, unknown> = {}) {
  const job = await send<{ id: string; number: number }>(s.tech, 'post', '/jobs', {
    customerId: s.customerId,
    boardId: s.boardId,
    unitDescription: 'Outdoor unit',
    symptom: 'Fan never starts',
    ...extra,
  });
  await send(s.tech, 'post', `/jobs/${job.id}/readings`, reading({ value: 2.1, raw: '2.1' }));
  await send(s.tech, 'patch', `/jobs/${job.id}`, { status: 'awaiting-review', proposedPart: 'R2' });
  await send(s.lead, 'post', `/jobs/${job.id}/reviews`, { decision: 'approve', comment: 'R2 open' });
  return job;
}

/** The approved job repaired, verified against TP1/TP2 and returned to the customer by courier. */
export async function returnedJob(s: Setup, extra: Record<string, unknown> = {}) {
  const job = await approvedJob(s, extra);
  await send(s.tech, 'post', `/jobs/${job.id}/repairs`, { part: 'R2', action: 'replaced', replacementValue: '10k' });
  await send(s.tech, 'post', `/jobs/${job.id}/readings`, reading({ phase: 'verification', value: 7.5, raw: '7.5' }));
  await send(s.tech, 'post', `/jobs/${job.id}/readings`, reading({ phase: 'verification', red: 'TP1', value: 15, raw: '15' }));
  await send(s.tech, 'patch', `/jobs/${job.id}`, { status: 'repaired' });
  await send(s.lead, 'patch', `/jobs/${job.id}`, { status: 'verified', functionalCheckDone: true });
  await send(s.tech, 'patch', `/jobs/${job.id}`, { status: 'returned', returnedVia: 'courier' });
  return job;
}
