import { createReadingResponse, type CreateReadingRequest } from '@splitscope/contract';
import { api } from '@/lib/api-client';

/** Records one reading. The body's idempotency key makes a re-send after a dropped connection harmless. */
export const createReading = (jobId: string, body: CreateReadingRequest) =>
  api(`/jobs/${encodeURIComponent(jobId)}/readings`, {
    method: 'POST',
    body: JSON.stringify(body),
    headers: { 'idempotency-key': body.idempotencyKey },
    schema: createReadingResponse,
  });
