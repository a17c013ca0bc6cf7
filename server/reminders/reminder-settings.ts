import { and, eq } from 'drizzle-orm';
import type * as z from 'zod';
import type {
  pushSubscriptionSchema,
  ReminderPreferences,
  reminderPreferencesSchema,
} from '../../shared/reminder-preferences.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { pushSubscriptions, reminderPreferences } from '../db/schema/reminders.js';
import { preferencesFrom } from './reminder-recipients.js';

/** The member's choices, or the defaults (`saved: false`) until they make some. */
export async function preferencesOf(
  ctx: ServerContext,
  userId: string,
): Promise<{ preferences: ReminderPreferences; saved: boolean }> {
  const [row] = await ctx.db.select().from(reminderPreferences).where(eq(reminderPreferences.userId, userId));
  return { preferences: preferencesFrom(row ?? null), saved: row !== undefined };
}

export async function savePreferences(
  ctx: ServerContext,
  userId: string,
  input: z.output<typeof reminderPreferencesSchema>,
): Promise<{ preferences: ReminderPreferences; saved: boolean }> {
  const values = {
    kinds: input.kinds,
    channels: input.channels,
    quietFrom: input.quietHours?.from ?? null,
    quietUntil: input.quietHours?.until ?? null,
    timeZone: input.timeZone,
    ...(input.recoatLeadMin === undefined ? {} : { recoatLeadMin: input.recoatLeadMin }),
    updatedAt: ctx.clock.now(),
  };
  await ctx.db
    .insert(reminderPreferences)
    .values({ userId, ...values })
    .onConflictDoUpdate({ target: reminderPreferences.userId, set: values });
  return preferencesOf(ctx, userId);
}

/**
 * Keeps a browser's push address for this member. An address is one browser profile, so if another
 * account had it (the phone changed hands, or someone signed in as someone else), it moves here.
 * Outside production a push address on this machine is allowed, for the test push service.
 */
export async function subscribe(
  ctx: ServerContext,
  userId: string,
  input: z.output<typeof pushSubscriptionSchema>,
): Promise<void> {
  const url = new URL(input.endpoint);
  const loopback = url.hostname === '127.0.0.1' || url.hostname === 'localhost';
  if (url.protocol !== 'https:' && !(loopback && !ctx.config.production)) {
    throw new AppError(422, 'invalid', 'Push addresses must use https.', { endpoint: 'Push addresses must use https' });
  }
  const values = { userId, p256dh: input.keys.p256dh, auth: input.keys.auth, label: input.label };
  await ctx.db
    .insert(pushSubscriptions)
    .values({ endpoint: input.endpoint, ...values })
    .onConflictDoUpdate({ target: pushSubscriptions.endpoint, set: values });
}

export async function unsubscribe(ctx: ServerContext, userId: string, endpoint: string): Promise<void> {
  await ctx.db
    .delete(pushSubscriptions)
    .where(and(eq(pushSubscriptions.userId, userId), eq(pushSubscriptions.endpoint, endpoint)));
}

/** The member's subscribed browsers, by name, without their keys. */
export async function devicesOf(ctx: ServerContext, userId: string) {
  return ctx.db
    .select({
      endpoint: pushSubscriptions.endpoint,
      label: pushSubscriptions.label,
      since: pushSubscriptions.createdAt,
    })
    .from(pushSubscriptions)
    .where(eq(pushSubscriptions.userId, userId));
}
