// Every request checks its session, and under load that lookup was one of the three round trips of a reading
// write. A row is kept here for a few seconds: sign-out, expiry extension and role changes made by this process
// update the kept row at once, so only a change made outside it (a second server, psql) waits up to TTL_MS.
import type { DatabaseSession, DatabaseUser } from 'lucia';

export const TTL_MS = 5000;
const LIMIT = 10_000;

interface Entry {
  session: DatabaseSession;
  user: DatabaseUser;
  at: number;
}

const entries = new Map<string, Entry>();

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
  entries.delete(session.id);
  entries.set(session.id, { session: { ...session }, user: { ...user, attributes: { ...user.attributes } }, at: now });
  if (entries.size > LIMIT) entries.delete(entries.keys().next().value as string);
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
  for (const [id, e] of entries) if (e.user.id === userId) entries.delete(id);
}

export function clearSessionCache(): void {
  entries.clear();
}
