import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia } from 'lucia';
import type { Role } from '@splitscope/contract';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';

export function createAuth(db: Db, { secureCookies }: { secureCookies: boolean }) {
  const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);
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
