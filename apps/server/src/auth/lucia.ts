import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { eq, sql } from 'drizzle-orm';
import { Cookie, generateIdFromEntropySize, Lucia, type DatabaseSession, type DatabaseUser } from 'lucia';
import type { Role } from '@splitscope/contract';
import type { Db } from '../db/client';
import { sessions, shops, users } from '../db/schema';
import type { Actor } from './guards';
import { cachedSession, clearSessionCache, extendCachedSession, forgetSession, forgetUserSessions, keepSession } from './session-cache';

const COOKIE = 'splitscope_session';
const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/**
 * lucia's Drizzle adapter, with the session check every request makes prepared once (the adapter's own query is
 * rebuilt on each call, a measured quarter millisecond of every request under load) and its rows kept a few
 * seconds (`session-cache.ts`). Every write through the adapter updates the kept rows. The row carries what the
 * lifetime check needs: when the session began, and the idle and absolute limits of the user's shop.
 * A deactivated person's sessions are deleted when they are deactivated; the join refuses them anyway.
 */
class SessionAdapter extends DrizzlePostgreSQLAdapter {
  private readonly sessionAndUser;
  constructor(db: Db) {
    super(db, sessions, users);
    this.sessionAndUser = db
      .select({
        id: sessions.id,
        userId: sessions.userId,
        expiresAt: sessions.expiresAt,
        createdAt: sessions.createdAt,
        email: users.email,
        name: users.name,
        role: users.role,
        shopId: users.shopId,
        deactivatedAt: users.deactivatedAt,
        idleHours: shops.sessionIdleHours,
        maxDays: shops.sessionMaxDays,
      })
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .innerJoin(shops, eq(shops.id, users.shopId))
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare('session_and_user');
  }

  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const kept = cachedSession(sessionId);
    if (kept) return kept;
    const [r] = await this.sessionAndUser.execute({ id: sessionId });
    if (!r || r.deactivatedAt) return [null, null];
    const session: DatabaseSession = { id: r.id, userId: r.userId, expiresAt: r.expiresAt, attributes: { createdAt: r.createdAt } };
    const user: DatabaseUser = {
      id: r.userId,
      attributes: { email: r.email, name: r.name, role: r.role, shopId: r.shopId, idleHours: r.idleHours, maxDays: r.maxDays },
    };
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

/** When a session ends at the latest: idle expiry (moved on use) or its start plus the shop's longest lifetime. */
export function sessionEnd(s: { expiresAt: Date; createdAt: Date }, maxDays: number): Date {
  return new Date(Math.min(s.expiresAt.getTime(), s.createdAt.getTime() + maxDays * DAY));
}

/**
 * Sessions with the lifetime each shop sets (default 12 h idle, 30 days at most). lucia reads the cookie and
 * stores the rows; the lifetime rule is ours, since lucia's is one fixed span for every user.
 */
export class Auth {
  private readonly lucia: Lucia;
  private readonly adapter: SessionAdapter;
  constructor(
    private readonly db: Db,
    private readonly secureCookies: boolean,
  ) {
    this.adapter = new SessionAdapter(db);
    this.lucia = new Lucia(this.adapter, { sessionCookie: { name: COOKIE, attributes: { secure: secureCookies, sameSite: 'lax' } } });
  }

  readSessionCookie(header: string): string | null {
    return this.lucia.readSessionCookie(header);
  }

  /** A new session for the user; answers its Set-Cookie value (lasting the shop's absolute lifetime). */
  async createSession(userId: string): Promise<string> {
    const [shop] = await this.db
      .select({ idleHours: shops.sessionIdleHours, maxDays: shops.sessionMaxDays })
      .from(users)
      .innerJoin(shops, eq(shops.id, users.shopId))
      .where(eq(users.id, userId));
    if (!shop) throw new Error(`no user ${userId}`);
    const id = generateIdFromEntropySize(25);
    await this.adapter.setSession({ id, userId, expiresAt: new Date(Date.now() + shop.idleHours * HOUR), attributes: {} });
    return new Cookie(COOKIE, id, { httpOnly: true, secure: this.secureCookies, sameSite: 'lax', path: '/', maxAge: shop.maxDays * 86_400 }).serialize();
  }

  /** The signed-in person of a session id, or null (unknown, deactivated, idle too long or past its lifetime). */
  async validate(sessionId: string, now = Date.now()): Promise<Actor | null> {
    const [session, user] = await this.adapter.getSessionAndUser(sessionId);
    if (!session || !user) return null;
    const a = user.attributes;
    const createdAt = (session.attributes as { createdAt: Date }).createdAt;
    const end = sessionEnd({ expiresAt: session.expiresAt, createdAt }, a.maxDays);
    if (now >= end.getTime()) {
      await this.adapter.deleteSession(sessionId);
      return null;
    }
    // Moved on at most every half idle period, so a busy session writes its row rarely.
    const idle = a.idleHours * HOUR;
    if (session.expiresAt.getTime() - now < idle / 2) {
      await this.adapter.updateSessionExpiration(sessionId, sessionEnd({ expiresAt: new Date(now + idle), createdAt }, a.maxDays));
    }
    return { id: user.id, email: a.email, name: a.name, role: a.role, shopId: a.shopId };
  }

  invalidateSession(sessionId: string): Promise<void> {
    return this.adapter.deleteSession(sessionId);
  }

  /** Sign-out everywhere, deactivation, a new password: every session of the person ends. */
  invalidateUserSessions(userId: string): Promise<void> {
    return this.adapter.deleteUserSessions(userId);
  }

  /** Drops the rows kept in this process, so the next request reads the database (tests that edit rows). */
  forgetKept(): void {
    clearSessionCache();
  }

  blankCookie(): string {
    return this.lucia.createBlankSessionCookie().serialize();
  }
}

export function createAuth(db: Db, { secureCookies }: { secureCookies: boolean }): Auth {
  return new Auth(db, secureCookies);
}

interface DatabaseUserAttributes {
  email: string;
  name: string;
  role: Role;
  shopId: string;
  idleHours: number;
  maxDays: number;
}

declare module 'lucia' {
  interface Register {
    Lucia: Lucia<Record<never, never>, DatabaseUserAttributes>;
    DatabaseUserAttributes: DatabaseUserAttributes;
  }
}
