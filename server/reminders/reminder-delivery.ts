import { and, asc, eq, isNull, lte, or } from 'drizzle-orm';
import { pourReminderTag } from '../../shared/pour-reminders.js';
import { MAX_RECOAT_LEAD_MIN, reminderSendAtMs, type ReminderKind } from '../../shared/reminder-preferences.js';
import type { ServerContext } from '../context.js';
import { pours } from '../db/schema/pours.js';
import { pushSubscriptions, reminderDeliveries, reminders } from '../db/schema/reminders.js';
import { users } from '../db/schema/users.js';
import { reminderMessage } from '../mail/messages.js';
import type { Transaction } from '../records/change-stamp.js';
import { notificationPayload, sendPush, type PushOutcome, type ReminderMessage } from './push-sender.js';
import { recipientsOf, type Recipient } from './reminder-recipients.js';
import type { VapidKeys } from './vapid-keys.js';

/** Minutes to wait before each retry of a delivery that failed; after the last, it is given up. */
const RETRY_AFTER_MIN = [1, 5, 15, 60];
const BATCH = 20;
/** Reminders made out per transaction; the caller goes on while batches come back full. */
export const FAN_OUT_BATCH = 200;

export interface Sending {
  vapid: VapidKeys;
  /** The contact a push service may use about our pushes (RFC 8292 `sub`). */
  vapidSubject: string;
}

/**
 * Makes out each recipient's deliveries for the reminders due by `now`, each held past quiet hours. A
 * recoat window's reminder is made out as soon as the longest lead a member may choose reaches it, each
 * member's delivery waiting until their own lead before the close.
 */
export async function fanOutDueReminders(ctx: ServerContext, now: Date): Promise<number> {
  return ctx.db.transaction(async (tx) => {
    const due = await tx
      .select({ reminder: reminders, buildId: pours.buildId, pourDeletedAt: pours.deletedAt })
      .from(reminders)
      .innerJoin(pours, eq(pours.id, reminders.pourId))
      .where(
        and(
          or(
            lte(reminders.dueAt, now),
            and(
              eq(reminders.kind, 'recoat-window-closes'),
              lte(reminders.dueAt, new Date(now.getTime() + MAX_RECOAT_LEAD_MIN * 60_000)),
            ),
          ),
          isNull(reminders.fannedOutAt),
          isNull(reminders.cancelledAt),
        ),
      )
      .orderBy(asc(reminders.dueAt))
      .limit(FAN_OUT_BATCH)
      .for('update', { of: reminders, skipLocked: true });
    const recipients = new Map<string, Recipient[]>();
    for (const { reminder, buildId, pourDeletedAt } of due) {
      if (pourDeletedAt === null) {
        const message = {
          title: reminder.title,
          body: reminder.body,
          url: `/builds/${buildId}?pour=${reminder.pourId}`,
        };
        const audience = `${reminder.workshopId}:${reminder.kind}`;
        if (!recipients.has(audience))
          recipients.set(audience, await recipientsOf(tx, reminder.workshopId, reminder.kind));
        const people = recipients.get(audience)!;
        // The same subject the open app uses for its own notification, so one replaces the other.
        const subject = pourReminderTag(reminder.pourId, reminder.key);
        await addDeliveries(tx, subject, people, message, reminder.dueAt, now, reminder.id, reminder.kind);
      }
      await tx
        .update(reminders)
        .set(pourDeletedAt === null ? { fannedOutAt: now } : { cancelledAt: now })
        .where(eq(reminders.id, reminder.id));
    }
    return due.length;
  });
}

/** One delivery per recipient and channel; a subject already made out for them is left as it is. */
export async function addDeliveries(
  tx: Transaction,
  subject: string,
  people: readonly Recipient[],
  message: ReminderMessage,
  dueAt: Date,
  now: Date,
  reminderId: string | null = null,
  kind: ReminderKind = 'shelf-digest',
): Promise<void> {
  const rows = people.flatMap((person) => {
    const sendAfter = new Date(reminderSendAtMs(dueAt.getTime(), kind, person.preferences, now.getTime()));
    return person.channels.map((channel) => ({
      subject,
      userId: person.userId,
      channel,
      reminderId,
      sendAfter,
      message,
    }));
  });
  if (rows.length > 0) await tx.insert(reminderDeliveries).values(rows).onConflictDoNothing();
}

/**
 * Sends every delivery due by `now`. Each batch is claimed with row locks (SKIP LOCKED) and marked
 * in the same transaction as it is sent, so two workers running at once never send one twice.
 */
export async function sendDueDeliveries(ctx: ServerContext, now: Date, sending: Sending): Promise<number> {
  let handled = 0;
  for (;;) {
    const count = await ctx.db.transaction(async (tx) => {
      const batch = await tx
        .select({ delivery: reminderDeliveries, email: users.email })
        .from(reminderDeliveries)
        .innerJoin(users, eq(users.id, reminderDeliveries.userId))
        .where(and(eq(reminderDeliveries.status, 'waiting'), lte(reminderDeliveries.sendAfter, now)))
        .orderBy(asc(reminderDeliveries.sendAfter))
        .limit(BATCH)
        .for('update', { of: reminderDeliveries, skipLocked: true });
      for (const { delivery, email } of batch) {
        let error: string | null;
        try {
          error =
            delivery.channel === 'email'
              ? await sendEmail(ctx, email, delivery.message)
              : await pushToEveryDevice(tx, delivery.userId, delivery.subject, delivery.message, sending);
        } catch (fault) {
          // One delivery that cannot even be attempted must not stop the others.
          ctx.log.error({ err: fault, subject: delivery.subject }, 'a reminder could not be sent');
          error = `it could not be sent (${(fault as Error).message})`;
        }
        const attempts = delivery.attempts + 1;
        const retryIn = RETRY_AFTER_MIN[attempts - 1];
        await tx
          .update(reminderDeliveries)
          .set(
            error === null
              ? { status: 'sent', attempts, sentAt: now, lastError: null }
              : retryIn === undefined
                ? { status: 'failed', attempts, lastError: error }
                : { attempts, lastError: error, sendAfter: new Date(now.getTime() + retryIn * 60_000) },
          )
          .where(
            and(
              eq(reminderDeliveries.subject, delivery.subject),
              eq(reminderDeliveries.userId, delivery.userId),
              eq(reminderDeliveries.channel, delivery.channel),
            ),
          );
      }
      return batch.length;
    });
    handled += count;
    if (count < BATCH) return handled;
  }
}

async function sendEmail(ctx: ServerContext, to: string, message: ReminderMessage): Promise<string | null> {
  try {
    await ctx.mailer.send(reminderMessage(to, message.title, message.body, `${ctx.config.publicOrigin}${message.url}`));
    return null;
  } catch (error) {
    return `the e-mail could not be sent (${(error as Error).message})`;
  }
}

/** To each browser the member subscribed; a browser that unsubscribed is forgotten. Null when one got it. */
async function pushToEveryDevice(
  tx: Transaction,
  userId: string,
  tag: string,
  message: ReminderMessage,
  sending: Sending,
): Promise<string | null> {
  const targets = await tx.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId));
  const payload = notificationPayload(message, tag);
  const errors: string[] = [];
  let delivered = false;
  for (const target of targets) {
    const outcome = await sendPush(target, payload, sending.vapid, sending.vapidSubject).catch(
      // web-push refuses to encrypt for a key it cannot use: that browser can never be reached.
      (): PushOutcome => ({ status: 'gone' }),
    );
    if (outcome.status === 'sent') delivered = true;
    else if (outcome.status === 'gone') await tx.delete(pushSubscriptions).where(eq(pushSubscriptions.id, target.id));
    else errors.push(outcome.error);
  }
  if (delivered) return null;
  return errors[0] ?? 'no browser of this member takes pushes any more';
}
