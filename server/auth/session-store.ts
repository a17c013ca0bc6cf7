/**
 * What the rest of the server knows about sessions. lucia (in maintenance upstream) lives only
 * behind this interface, in lucia-session-store.ts, so it can be replaced without touching routes.
 */
export interface SignedInUser {
  id: string;
  email: string;
  displayName: string;
  emailVerified: boolean;
}

export interface ValidatedSession {
  sessionId: string;
  user: SignedInUser;
  /** A Set-Cookie value when the session was extended or has ended. */
  refreshedCookie?: string;
}

export interface SessionStore {
  /** Starts a new session (a new id every sign-in) and answers its Set-Cookie value. */
  create(userId: string): Promise<{ sessionId: string; cookie: string }>;
  /** Reads the session from a Cookie header; null when there is none or it has ended. */
  validate(cookieHeader: string | undefined): Promise<ValidatedSession | null>;
  end(sessionId: string): Promise<void>;
  endAllFor(userId: string, exceptSessionId?: string): Promise<void>;
  /** The Set-Cookie value that clears the cookie. */
  blankCookie(): string;
}
