import { problemSchema, type Problem } from '@splitscope/contract';
import type { z } from 'zod';

/** The one client-side error: the server's problem+json, or a network failure. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly problem: Problem | null,
  ) {
    super(problem?.detail ?? (status === 0 ? 'The server cannot be reached; check the connection' : `Request failed (${status})`));
  }
  get isNetwork() {
    return this.status === 0;
  }
}

export async function api<S extends z.ZodType>(path: string, init: RequestInit & { schema?: S } = {}): Promise<z.infer<S>> {
  const { schema, ...rest } = init;
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      credentials: 'same-origin',
      ...rest,
      headers: { ...(rest.body && !(rest.body instanceof FormData) ? { 'content-type': 'application/json' } : {}), ...rest.headers },
    });
  } catch {
    throw new ApiError(0, null);
  }
  if (!res.ok) {
    const body = await res.json().catch(() => null);
    const parsed = problemSchema.safeParse(body);
    throw new ApiError(res.status, parsed.success ? parsed.data : null);
  }
  if (res.status === 204) return undefined as z.infer<S>;
  const json: unknown = await res.json();
  return schema ? schema.parse(json) : (json as z.infer<S>);
}
