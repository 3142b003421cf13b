/**
 * Shop data for one browser spec, made through the API with the defaults the seed's factories use
 * (apps/server/src/testing/requests.ts), so a spec never looks for a demo job another spec may have moved on.
 *
 * API (every function takes the signed-in page, whose calls carry its session cookie, or an API session):
 * - `api.get<T>(page, path)`, `api.send<T>(page, method, path, body?, expected = 2xx)`: the JSON API, path
 *   without `/api`; a status other than the expected one fails the test with the server's answer.
 * - `createCustomer(page, overrides?)` → `Customer`: a customer of the page user's shop, named with `runTag()`
 *   so its name and e-mail are the spec's alone.
 * - `createJob(page, overrides?)` → `JobDetail`: a job on the shop's demo outdoor fan-drive board (`shopBoard`)
 *   for a customer of its own (`overrides.customerId` to reuse one), assigned to nobody unless told.
 * - `shopBoard(page, key?)` → board id: the page user's shop's copy of a demo board (`DEMO_BOARD_IDS` key; a test
 *   shop's, support/own-shop.ts, or the demo shop's own).
 * - `recordReading(page, jobId, reading)` → `CreateReadingResponse`: one meter reading; the idempotency key and
 *   the typed text are filled in (`readingRequest`).
 * - `moveJob(page, jobId, change)` → `Job`: a PATCH of the job (status moves, proposals, sign-off).
 * - `copyBoard(page, boardId)` → `BoardDetail`: a new board model of the shop with the document of `boardId`
 *   (id and slug made unique), for a spec that edits a board (admins only).
 * - `runTag()`: a short id unique to this run, for names a spec searches for.
 * Roles: customers and jobs need a technician or above (ROLES.bench); sign a trainee in afterwards if the spec
 * is about a trainee.
 */
import type { APIRequestContext, Page } from '@playwright/test';
import type {
  BoardDetail,
  BoardList,
  CreateCustomerRequest,
  CreateJobRequest,
  CreateReadingRequest,
  CreateReadingResponse,
  Customer,
  JobDetail,
  UpdateJobRequest,
  Job,
} from '@splitscope/contract';
import { CUSTOMER_DEFAULTS, DEMO_BOARD_IDS, JOB_DEFAULTS, readingRequest } from '../../../apps/server/src/testing/requests';
import { expect } from '../fixtures';

export { DEMO_BOARD_IDS };

export const runTag = (): string => crypto.randomUUID().slice(0, 8);

/** A signed-in page (its session cookie) or an API session of its own (support/divider-job.ts `apiAs`). */
type Caller = Page | APIRequestContext;
const requestOf = (c: Caller): APIRequestContext => ('request' in c ? c.request : c);

export const api = {
  async get<T>(page: Caller, path: string): Promise<T> {
    const res = await requestOf(page).get(`/api${path}`);
    expect(res.ok(), `GET ${path} → ${res.status()} ${await res.text()}`).toBe(true);
    return (await res.json()) as T;
  },
  async send<T>(page: Caller, method: 'POST' | 'PATCH' | 'PUT' | 'DELETE', path: string, body?: unknown, expected?: number): Promise<T> {
    const res = await requestOf(page).fetch(`/api${path}`, { method, data: body });
    const text = await res.text();
    if (expected === undefined) expect(res.ok(), `${method} ${path} → ${res.status()} ${text}`).toBe(true);
    else expect(res.status(), `${method} ${path}: ${text}`).toBe(expected);
    return (text ? JSON.parse(text) : null) as T;
  },
};

export function createCustomer(page: Caller, overrides: Partial<CreateCustomerRequest> = {}): Promise<Customer> {
  const tag = runTag();
  return api.send<Customer>(page, 'POST', '/customers', {
    ...CUSTOMER_DEFAULTS,
    name: `${CUSTOMER_DEFAULTS.name} ${tag}`,
    email: `customer-${tag}@example.test`,
    ...overrides,
  });
}

export async function createJob(page: Caller, overrides: Partial<CreateJobRequest> = {}): Promise<JobDetail> {
  const customerId = overrides.customerId ?? (await createCustomer(page)).id;
  const boardId = overrides.boardId ?? (await shopBoard(page));
  const body: CreateJobRequest = { ...JOB_DEFAULTS, ...overrides, boardId, customerId };
  const created = await api.send<{ id: string }>(page, 'POST', '/jobs', body, 201);
  return api.get<JobDetail>(page, `/jobs/${created.id}`);
}

/** The page user's shop's board of a demo board: a test shop stores it as `<shop id>-<demo board id>`. */
export async function shopBoard(page: Caller, key: keyof typeof DEMO_BOARD_IDS = 'outdoorFan'): Promise<string> {
  const { items } = await api.get<BoardList>(page, '/boards');
  const board = items.find((b) => b.id.endsWith(DEMO_BOARD_IDS[key]));
  expect(board, `the shop's ${key} demo board`).toBeDefined();
  return board!.id;
}

export function recordReading(page: Caller, jobId: string, reading: Parameters<typeof readingRequest>[0]): Promise<CreateReadingResponse> {
  const body: CreateReadingRequest = readingRequest(reading);
  return api.send<CreateReadingResponse>(page, 'POST', `/jobs/${jobId}/readings`, body, 201);
}

export function moveJob(page: Caller, jobId: string, change: UpdateJobRequest): Promise<Job> {
  return api.send<Job>(page, 'PATCH', `/jobs/${jobId}`, change);
}

export async function copyBoard(page: Page, boardId: string): Promise<BoardDetail> {
  const { document } = await api.get<BoardDetail>(page, `/boards/${boardId}`);
  const tag = runTag();
  const copy = { ...document, id: `${document.id}-${tag}`, slug: `${document.slug}-${tag}`, name: `${document.name} (${tag})` };
  return api.send<BoardDetail>(page, 'POST', '/boards', { document: copy, note: 'copy for a browser test' }, 201);
}
