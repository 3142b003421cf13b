import { afterEach, describe, expect, it } from 'vitest';
import {
  cachedSession,
  clearSessionCache,
  extendCachedSession,
  forgetSession,
  forgetUserSessions,
  keepSession,
  TTL_MS,
} from '../../apps/server/src/auth/session-cache';

const session = (id: string, userId: string) => ({ id, userId, expiresAt: new Date(Date.UTC(2030, 0, 1)), attributes: {} });
const user = (id: string, role: string) => ({ id, attributes: { email: `${id}@x.test`, name: id, role, shopId: 's' } });

afterEach(() => clearSessionCache());

describe('kept sessions', () => {
  it('answer within the TTL and not after it', () => {
    keepSession(session('a', 'u1'), user('u1', 'tech') as never, 1000);
    expect(cachedSession('a', 1000 + TTL_MS - 1)?.[1].attributes).toMatchObject({ role: 'tech' });
    expect(cachedSession('a', 1000 + TTL_MS)).toBeUndefined();
    // Expired entries are dropped, not kept to answer later.
    expect(cachedSession('a', 1000)).toBeUndefined();
  });

  it('a caller changing its copy does not change the kept row', () => {
    keepSession(session('a', 'u1'), user('u1', 'tech') as never, 0);
    const [, u] = cachedSession('a', 1)!;
    (u.attributes as { role: string }).role = 'admin';
    expect(cachedSession('a', 2)?.[1].attributes).toMatchObject({ role: 'tech' });
  });

  it('follow expiry extension, sign-out and changes to the user', () => {
    keepSession(session('a', 'u1'), user('u1', 'tech') as never, 0);
    keepSession(session('b', 'u1'), user('u1', 'tech') as never, 0);
    keepSession(session('c', 'u2'), user('u2', 'lead') as never, 0);
    const later = new Date(Date.UTC(2031, 0, 1));
    extendCachedSession('a', later);
    expect(cachedSession('a', 1)?.[0].expiresAt).toEqual(later);
    forgetSession('a');
    expect(cachedSession('a', 1)).toBeUndefined();
    forgetUserSessions('u1');
    expect(cachedSession('b', 1)).toBeUndefined();
    expect(cachedSession('c', 1)).toBeDefined();
  });
});
