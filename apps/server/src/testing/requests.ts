// What a test customer, job or reading looks like when a test does not care: one set of defaults for the
// factories the seed and the integration tests call (factories.ts, straight into the services) and for the
// browser specs' helpers (tests/e2e/support/shop-data.ts), which send the same bodies through the API.
// Pure values only, so a browser spec can import it without loading the server.
import type { CreateCustomerRequest, CreateJobRequest, CreateReadingRequest } from '@splitscope/contract';

export const CUSTOMER_DEFAULTS = { name: 'Test Customer', kind: 'contractor' } as const satisfies Partial<CreateCustomerRequest>;

export const JOB_DEFAULTS = { unitDescription: 'Test outdoor unit', symptom: 'outdoor fan never starts' } as const satisfies Partial<CreateJobRequest>;

/** The demo shop's board models: the seed stores them under these ids, the browser specs open jobs on them. */
export const DEMO_BOARD_IDS = { outdoorFan: 'board-demo-ofd-220', indoorFan: 'board-demo-idf-310' } as const;

/** A reading as the bench sends it: a fresh idempotency key, and the typed text made from the value. */
export function readingRequest(
  r: Omit<CreateReadingRequest, 'idempotencyKey' | 'raw'> & Partial<Pick<CreateReadingRequest, 'idempotencyKey' | 'raw'>>,
): CreateReadingRequest {
  return { idempotencyKey: crypto.randomUUID(), raw: String(r.value), ...r };
}

/** The reading most integration tests start from: DC V powered, TP2 to ground, 7.5 V (the demo board's divider). */
export function dividerReading(over: Partial<CreateReadingRequest> = {}): CreateReadingRequest {
  return readingRequest({ mode: 'dcv', red: 'TP2', black: 'gnd', power: 'on', value: 7.5, ...over });
}
