// Every request checks its session, and under load that lookup was one of the three round trips of a reading
// write. A row is kept here for a few seconds: sign-out, expiry extension and role changes made by this process
// update the kept row at once, so only a change made outside it (a second server, psql) waits up to TTL_MS.
import type { DatabaseSession, DatabaseUser } from 'lucia';
import { LRUCache } from 'lru-cache';

export const TTL_MS = 5000;
const LIMIT = 10_000;

interface Entry {
  session: DatabaseSession;
  user: DatabaseUser;
  at: number;
}

// Least recently used dropped first past LIMIT. The age is checked against `at` here rather than by lru-cache's
// ttl, so the tests can give the clock.
const entries = new LRUCache<string, Entry>({ max: LIMIT });

export function cachedSession(id: string, now = Date.now()): [DatabaseSession, DatabaseUser] | undefined {
  const e = entries.get(id);
  if (!e) return undefined;
  if (now - e.at >= TTL_MS) {
    entries.delete(id);
    return undefined;
  }
  // Copies: lucia builds its own objects from these, but a kept row must never change under a caller.
  return [{ ...e.session }, { ...e.user, attributes: { ...e.user.attributes } }];
}

export function keepSession(session: DatabaseSession, user: DatabaseUser, now = Date.now()): void {
  entries.set(session.id, { session: { ...session }, user: { ...user, attributes: { ...user.attributes } }, at: now });
}

export function extendCachedSession(id: string, expiresAt: Date): void {
  const e = entries.get(id);
  if (e) e.session = { ...e.session, expiresAt };
}

export function forgetSession(id: string): void {
  entries.delete(id);
}

/** After a change to the user (role) or all of their sessions, so the next request reads the database. */
export function forgetUserSessions(userId: string): void {
  const ids = [...entries.entries()].filter(([, e]) => e.user.id === userId).map(([id]) => id);
  for (const id of ids) entries.delete(id);
}

export function clearSessionCache(): void {
  entries.clear();
}
