import type { ErrorRequestHandler, RequestHandler } from 'express';
import { nulPath, type Problem } from '@splitscope/contract';
import { z } from 'zod';

const statusOf = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  invalid: 422,
  rate_limited: 429,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof statusOf;

/** The one error type services throw; the error middleware turns it into problem+json. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    readonly detail: string,
    readonly extra: Pick<Problem, 'errors' | 'allowed'> = {},
  ) {
    super(detail);
  }
  get status(): number {
    return statusOf[this.code];
  }
}

const titles: Record<ErrorCode, string> = {
  bad_request: 'Bad request',
  unauthorized: 'Sign-in required',
  forbidden: 'Not allowed for your role',
  not_found: 'Not found',
  conflict: 'Conflict',
  too_large: 'Too large',
  unsupported_media_type: 'Unsupported media type',
  invalid: 'Invalid input',
  rate_limited: 'Too many attempts',
  unavailable: 'Temporarily unavailable',
};

/** Validates input against a contract schema; failures become one 422 that lists the failing fields. */
export function parse<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const nul = nulPath(value);
  if (nul)
    throw new AppError('invalid', `Invalid input: ${nul}: must not contain the NUL character`, {
      errors: [{ path: nul, message: 'must not contain the NUL character' }],
    });
  const r = schema.safeParse(value);
  if (r.success) return r.data;
  const errors = r.error.issues.map((i) => ({ path: i.path.map(String).join('.') || '(body)', message: i.message }));
  throw new AppError('invalid', `Invalid input: ${errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`, { errors });
}

export function problem(err: AppError): Problem {
  return {
    type: `https://splitscope.invalid/problems/${err.code}`,
    title: titles[err.code],
    status: err.status,
    detail: err.detail,
    code: err.code,
    ...err.extra,
  };
}

export function sendProblem(res: Parameters<RequestHandler>[1], err: AppError): void {
  if (err.code === 'unavailable') res.setHeader('Retry-After', '2');
  res.status(err.status).type('application/problem+json').json(problem(err));
}

// Data errors PostgreSQL raises for a value it cannot store (a NUL in text, a number or date out of its range,
// a malformed value). Every such input should already be refused by the contract; this is the last line, so
// a gap there is still the client's 422 and not a 500.
const DATA_ERRORS: Record<string, string> = {
  '22P05': 'text contains a character that cannot be stored (NUL)',
  '22021': 'text contains a character that cannot be stored',
  '22003': 'a number is out of range',
  '22008': 'a date or time is out of range',
  '22007': 'a date or time is not valid',
  '22P02': 'a value is not in a form that can be stored',
  '22001': 'a text is too long',
};

const DB_DOWN = new Set(['ECONNREFUSED', 'ECONNRESET', '57P01', '57P02', '57P03', '08006', '08001', '08003', 'ETIMEDOUT']);

function isDbDown(err: unknown): boolean {
  const e = err as { code?: string; message?: string; cause?: unknown };
  if (e?.code && DB_DOWN.has(e.code)) return true;
  if (/Connection terminated|timeout exceeded when trying to connect|connect ECONNREFUSED/i.test(e?.message ?? '')) return true;
  return e?.cause ? isDbDown(e.cause) : false;
}

/** The one error middleware: known errors as problem+json, everything else as a 500 without a stack trace. */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof AppError) return sendProblem(res, err);
  const e = err as { type?: string; status?: number; statusCode?: number };
  // body-parser's own errors carry a type and a status
  if (e?.type === 'entity.too.large') return sendProblem(res, new AppError('too_large', 'The request body is too large'));
  if (e?.type === 'entity.parse.failed') return sendProblem(res, new AppError('bad_request', 'The request body is not valid JSON'));
  if (e?.type === 'encoding.unsupported' || e?.type === 'charset.unsupported')
    return sendProblem(res, new AppError('unsupported_media_type', 'Unsupported body encoding'));
  const pgCode = (err as { code?: unknown; cause?: { code?: unknown } })?.code ?? (err as { cause?: { code?: unknown } })?.cause?.code;
  if (typeof pgCode === 'string' && DATA_ERRORS[pgCode]) {
    console.error(`refused input the contract let through (${pgCode}):`, (err as Error).message);
    return sendProblem(res, new AppError('invalid', `Invalid input: ${DATA_ERRORS[pgCode]}`));
  }
  if (isDbDown(err)) return sendProblem(res, new AppError('unavailable', 'The database is not reachable right now; try again shortly'));
  const status = e?.status ?? e?.statusCode;
  if (typeof status === 'number' && status >= 400 && status < 500) {
    return sendProblem(res, new AppError('bad_request', 'The request could not be read'));
  }
  console.error('unhandled error:', err);
  res.status(500).type('application/problem+json').json({
    type: 'https://splitscope.invalid/problems/internal',
    title: 'Internal error',
    status: 500,
    detail: 'Something went wrong on the server; the error was logged.',
    code: 'internal',
  });
};

export const notFoundApi: RequestHandler = (req, _res, next) => next(new AppError('not_found', `No API route ${req.method} ${req.path}`));
