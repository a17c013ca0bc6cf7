import { and, eq, inArray, isNull } from 'drizzle-orm';
import { followedReminders, type PourReminder } from '../../shared/pour-reminders.js';
import { reminderSendAtMs } from '../../shared/reminder-preferences.js';
import { builds } from '../db/schema/builds.js';
import { pours } from '../db/schema/pours.js';
import { reminderDeliveries, reminderPreferences, reminders } from '../db/schema/reminders.js';
import type { Transaction } from '../records/change-stamp.js';
import { followRow, liveLayersOf } from '../pours/followed-pour-row.js';
import { preferencesFrom } from './reminder-recipients.js';

type ReminderRow = typeof reminders.$inferSelect;

/**
 * Brings a pour's reminders in line with the pour as really poured, in the transaction of the write
 * that changed it: a new moment gets a reminder, a moved one moves (its waiting deliveries too, when
 * it was already made out), and one no longer wanted (its layer is on, or the pour is gone) is
 * cancelled with its waiting deliveries. Unique per pour and key, and a delivery once sent is never
 * made out again, so working them out again never sends one twice.
 */
export async function reschedulePourReminders(tx: Transaction, pourId: string, now: Date): Promise<void> {
  const [pour] = await tx.select().from(pours).where(eq(pours.id, pourId));
  const wanted = pour && pour.deletedAt === null ? await wantedReminders(tx, pour) : [];
  // Locked, so a fan-out running now skips them rather than making out a moment that is moving.
  const existing = await tx.select().from(reminders).where(eq(reminders.pourId, pourId)).for('update');
  const byKey = new Map(existing.map((row) => [row.key, row]));
  const fresh = wanted.filter((reminder) => !byKey.has(reminder.key));
  if (fresh.length > 0) {
    await tx
      .insert(reminders)
      .values(fresh.map((reminder) => ({ workshopId: pour!.workshopId, pourId, ...fieldsOf(reminder) })))
      .onConflictDoNothing({ target: [reminders.pourId, reminders.key] });
  }
  for (const reminder of wanted) {
    const row = byKey.get(reminder.key);
    if (row) await keepUpToDate(tx, row, reminder, now);
  }
  const wantedKeys = new Set(wanted.map((reminder) => reminder.key));
  const unwanted = existing.filter((row) => !wantedKeys.has(row.key) && row.cancelledAt === null);
  await cancel(
    tx,
    unwanted.map((row) => row.id),
    now,
  );
}

async function wantedReminders(tx: Transaction, pour: typeof pours.$inferSelect): Promise<PourReminder[]> {
  const [build] = await tx.select({ name: builds.name }).from(builds).where(eq(builds.id, pour.buildId));
  const followed = followRow(pour, await liveLayersOf(tx, pour.id));
  return followedReminders(followed, { buildName: build?.name ?? 'your build', feature: pour.note });
}

const fieldsOf = (reminder: PourReminder) => ({
  key: reminder.key,
  kind: reminder.kind,
  dueAt: new Date(reminder.dueAtMs),
  title: reminder.title,
  body: reminder.body,
});

async function keepUpToDate(tx: Transaction, row: ReminderRow, reminder: PourReminder, now: Date): Promise<void> {
  const moved = row.dueAt.getTime() !== reminder.dueAtMs;
  const reworded = row.title !== reminder.title || row.body !== reminder.body;
  if (row.cancelledAt !== null) {
    // Wanted again (a layer taken back): made out afresh; deliveries already sent stay, so none goes twice.
    await tx
      .delete(reminderDeliveries)
      .where(and(eq(reminderDeliveries.reminderId, row.id), eq(reminderDeliveries.status, 'cancelled')));
    await tx
      .update(reminders)
      .set({ ...fieldsOf(reminder), cancelledAt: null, fannedOutAt: null })
      .where(eq(reminders.id, row.id));
    return;
  }
  if (!moved && !reworded) return;
  await tx.update(reminders).set(fieldsOf(reminder)).where(eq(reminders.id, row.id));
  if (row.fannedOutAt !== null) await moveWaitingDeliveries(tx, row, reminder, now);
}

/** A reminder already made out whose moment moved: each waiting delivery goes by the member's own lead and quiet hours. */
async function moveWaitingDeliveries(
  tx: Transaction,
  row: ReminderRow,
  reminder: PourReminder,
  now: Date,
): Promise<void> {
  const waiting = await tx
    .select({ delivery: reminderDeliveries, preferences: reminderPreferences })
    .from(reminderDeliveries)
    .leftJoin(reminderPreferences, eq(reminderPreferences.userId, reminderDeliveries.userId))
    .where(and(eq(reminderDeliveries.reminderId, row.id), eq(reminderDeliveries.status, 'waiting')))
    .for('update', { of: reminderDeliveries, skipLocked: true });
  for (const { delivery, preferences } of waiting) {
    const sendAfter = new Date(
      reminderSendAtMs(reminder.dueAtMs, reminder.kind, preferencesFrom(preferences), now.getTime()),
    );
    await tx
      .update(reminderDeliveries)
      .set({
        sendAfter: delivery.attempts === 0 ? sendAfter : delivery.sendAfter,
        message: { ...delivery.message, title: reminder.title, body: reminder.body },
      })
      .where(
        and(
          eq(reminderDeliveries.subject, delivery.subject),
          eq(reminderDeliveries.userId, delivery.userId),
          eq(reminderDeliveries.channel, delivery.channel),
          eq(reminderDeliveries.status, 'waiting'),
        ),
      );
  }
}

/** Reminders that have not gone out stop here, and so do their waiting deliveries. */
async function cancel(tx: Transaction, ids: readonly string[], at: Date): Promise<void> {
  if (ids.length === 0) return;
  await tx
    .update(reminders)
    .set({ cancelledAt: at })
    .where(and(inArray(reminders.id, [...ids]), isNull(reminders.cancelledAt)));
  await tx
    .update(reminderDeliveries)
    .set({ status: 'cancelled' })
    .where(and(inArray(reminderDeliveries.reminderId, [...ids]), eq(reminderDeliveries.status, 'waiting')));
}
