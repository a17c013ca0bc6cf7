import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { and, eq, ne } from 'drizzle-orm';
import { Lucia, TimeSpan } from 'lucia';
import type { Database } from '../db/database.js';
import { sessions, users } from '../db/schema/index.js';
import type { SessionStore } from './session-store.js';

interface UserColumns {
  email: string;
  displayName: string;
  emailVerifiedAt: Date | null;
}

type BenchtideLucia = Lucia<Record<never, never>, UserColumns>;

declare module 'lucia' {
  interface Register {
    Lucia: BenchtideLucia;
    DatabaseUserAttributes: UserColumns;
  }
}

export const SESSION_COOKIE = 'benchtide_session';

export function luciaSessionStore(db: Database, secureCookies: boolean): SessionStore {
  const lucia: BenchtideLucia = new Lucia(new DrizzlePostgreSQLAdapter(db, sessions, users), {
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: { name: SESSION_COOKIE, attributes: { secure: secureCookies, sameSite: 'lax' } },
    getUserAttributes: ({ email, displayName, emailVerifiedAt }) => ({ email, displayName, emailVerifiedAt }),
  });

  return {
    async create(userId) {
      const session = await lucia.createSession(userId, {});
      return { sessionId: session.id, cookie: lucia.createSessionCookie(session.id).serialize() };
    },
    async validate(cookieHeader) {
      const sessionId = lucia.readSessionCookie(cookieHeader ?? '');
      if (!sessionId) return null;
      const { session, user } = await lucia.validateSession(sessionId);
      if (!session) return null;
      return {
        sessionId: session.id,
        user: {
          id: user.id,
          email: user.email,
          displayName: user.displayName,
          emailVerified: user.emailVerifiedAt !== null,
        },
        ...(session.fresh ? { refreshedCookie: lucia.createSessionCookie(session.id).serialize() } : {}),
      };
    },
    async end(sessionId) {
      await lucia.invalidateSession(sessionId);
    },
    async endAllFor(userId, exceptSessionId) {
      await db
        .delete(sessions)
        .where(
          exceptSessionId === undefined
            ? eq(sessions.userId, userId)
            : and(eq(sessions.userId, userId), ne(sessions.id, exceptSessionId)),
        );
    },
    blankCookie() {
      return lucia.createBlankSessionCookie().serialize();
    },
  };
}
