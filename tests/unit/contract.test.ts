import { problemSchema, signInRequest } from '@splitscope/contract';
import { describe, expect, it } from 'vitest';

describe('shared contract', () => {
  it('normalises the sign-in e-mail so "Tech@Demo.test " finds the same account', () => {
    expect(signInRequest.parse({ email: ' Tech@Demo.TEST ', password: 'x' }).email).toBe('tech@demo.test');
  });
  it('refuses a sign-in without a password', () => {
    expect(signInRequest.safeParse({ email: 'tech@demo.test', password: '' }).success).toBe(false);
  });
  it('describes RFC 9457 problem details with optional field errors', () => {
    const p = { type: 'about:blank', title: 'Invalid input', status: 422, detail: 'x', code: 'invalid', errors: [{ path: 'value', message: 'bad' }] };
    expect(problemSchema.parse(p)).toEqual(p);
  });
});
