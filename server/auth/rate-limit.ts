import { sql } from 'drizzle-orm';
import type { Database } from '../db/database.js';
import { rateLimitWindows } from '../db/schema/index.js';
import { AppError } from '../core/app-error.js';
import type { Clock } from '../core/clock.js';

export interface RateLimit {
  /** What is limited, for the key: 'sign-in:address', 'reset:account'... */
  name: string;
  max: number;
  windowMinutes: number;
}

/**
 * Counts one attempt against each limit and refuses with 429 once any is spent. The counters
 * live in PostgreSQL so every API process sees the same ones.
 */
export async function spendAttempt(
  db: Database,
  clock: Clock,
  attempts: readonly { limit: RateLimit; subject: string }[],
): Promise<void> {
  const now = clock.now();
  let retryAfterMinutes = 0;
  for (const { limit, subject } of attempts) {
    const windowFloor = new Date(now.getTime() - limit.windowMinutes * 60_000);
    const stale = sql`(${rateLimitWindows.windowStartedAt} <= ${windowFloor} OR ${rateLimitWindows.windowStartedAt} > ${now})`;
    const [window] = await db
      .insert(rateLimitWindows)
      .values({ key: `${limit.name}:${subject}`, windowStartedAt: now, hits: 1 })
      .onConflictDoUpdate({
        target: rateLimitWindows.key,
        // A window that has ended, or that another process's clock put in our future, starts afresh.
        set: {
          hits: sql`CASE WHEN ${stale} THEN 1 ELSE ${rateLimitWindows.hits} + 1 END`,
          windowStartedAt: sql`CASE WHEN ${stale} THEN ${now} ELSE ${rateLimitWindows.windowStartedAt} END`,
        },
      })
      .returning();
    if (window && window.hits > limit.max) {
      const endsAt = window.windowStartedAt.getTime() + limit.windowMinutes * 60_000;
      retryAfterMinutes = Math.max(retryAfterMinutes, Math.ceil((endsAt - now.getTime()) / 60_000));
    }
  }
  if (retryAfterMinutes > 0) {
    const error = new AppError(
      429,
      'rate_limited',
      `Too many attempts. Try again in ${retryAfterMinutes} ${retryAfterMinutes === 1 ? 'minute' : 'minutes'}.`,
    );
    error.retryAfterMinutes = retryAfterMinutes;
    throw error;
  }
}

export const LIMITS = {
  signInByAddress: { name: 'sign-in:address', max: 30, windowMinutes: 15 },
  signInByAccount: { name: 'sign-in:account', max: 8, windowMinutes: 15 },
  signUpByAddress: { name: 'sign-up:address', max: 10, windowMinutes: 60 },
  signUpByAccount: { name: 'sign-up:account', max: 3, windowMinutes: 60 },
  emailByAddress: { name: 'mail:address', max: 10, windowMinutes: 60 },
  emailByAccount: { name: 'mail:account', max: 3, windowMinutes: 60 },
} satisfies Record<string, RateLimit>;
