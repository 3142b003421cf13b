import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { eq, sql } from 'drizzle-orm';
import { Lucia, type DatabaseSession, type DatabaseUser } from 'lucia';
import type { Role } from '@splitscope/contract';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';
import { cachedSession, clearSessionCache, extendCachedSession, forgetSession, forgetUserSessions, keepSession } from './session-cache';

/**
 * lucia's Drizzle adapter, with the session check every request makes prepared once (the adapter's own query is
 * rebuilt on each call, a measured quarter millisecond of every request under load) and its rows kept a few
 * seconds (`session-cache.ts`). Every write through the adapter updates the kept rows.
 */
class SessionAdapter extends DrizzlePostgreSQLAdapter {
  private readonly sessionAndUser;
  constructor(db: Db) {
    super(db, sessions, users);
    this.sessionAndUser = db
      .select({ id: sessions.id, userId: sessions.userId, expiresAt: sessions.expiresAt, email: users.email, name: users.name, role: users.role, shopId: users.shopId })
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare('session_and_user');
  }

  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const kept = cachedSession(sessionId);
    if (kept) return kept;
    const [r] = await this.sessionAndUser.execute({ id: sessionId });
    if (!r) return [null, null];
    const session: DatabaseSession = { id: r.id, userId: r.userId, expiresAt: r.expiresAt, attributes: {} };
    const user: DatabaseUser = { id: r.userId, attributes: { email: r.email, name: r.name, role: r.role, shopId: r.shopId } };
    keepSession(session, user);
    return [session, user];
  }

  override async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
    await super.updateSessionExpiration(sessionId, expiresAt);
    extendCachedSession(sessionId, expiresAt);
  }

  override async deleteSession(sessionId: string): Promise<void> {
    forgetSession(sessionId);
    await super.deleteSession(sessionId);
  }

  override async deleteUserSessions(userId: string): Promise<void> {
    forgetUserSessions(userId);
    await super.deleteUserSessions(userId);
  }

  override async deleteExpiredSessions(): Promise<void> {
    clearSessionCache();
    await super.deleteExpiredSessions();
  }
}

export function createAuth(db: Db, { secureCookies }: { secureCookies: boolean }) {
  const adapter = new SessionAdapter(db);
  return new Lucia(adapter, {
    sessionCookie: {
      name: 'splitscope_session',
      expires: false,
      attributes: { secure: secureCookies, sameSite: 'lax' },
    },
    getUserAttributes: (a) => ({ email: a.email, name: a.name, role: a.role, shopId: a.shopId }),
  });
}

export type Auth = ReturnType<typeof createAuth>;

interface DatabaseUserAttributes {
  email: string;
  name: string;
  role: Role;
  shopId: string;
}

declare module 'lucia' {
  interface Register {
    Lucia: Auth;
    DatabaseUserAttributes: DatabaseUserAttributes;
  }
}
