import { and, eq, inArray, isNull } from 'drizzle-orm';
import { pourReminders } from '../../shared/pour-reminders.js';
import type { PourPlan } from '../../shared/pour-plan.js';
import { builds } from '../db/schema/builds.js';
import { reminderDeliveries, reminders } from '../db/schema/reminders.js';
import type { Transaction } from '../records/change-stamp.js';

interface ScheduledPour {
  id: string;
  workshopId: string;
  buildId: string;
  note: string;
  plan: Pick<PourPlan, 'cure'>;
}

/**
 * A pour's reminders, written in the pour's own transaction. Unique per pour and key, so working
 * them out again never makes a second one. A pour is not edited in place (a wrong one is deleted,
 * which cancels its reminders, and logged again), so there is nothing to move.
 */
export async function scheduleReminders(tx: Transaction, pour: ScheduledPour): Promise<void> {
  const [build] = await tx.select({ name: builds.name }).from(builds).where(eq(builds.id, pour.buildId));
  const due = pourReminders(pour.plan.cure, { buildName: build?.name ?? 'your build', feature: pour.note });
  if (due.length === 0) return;
  await tx
    .insert(reminders)
    .values(
      due.map((reminder) => ({
        workshopId: pour.workshopId,
        pourId: pour.id,
        key: reminder.key,
        kind: reminder.kind,
        dueAt: new Date(reminder.dueAtMs),
        title: reminder.title,
        body: reminder.body,
      })),
    )
    .onConflictDoNothing({ target: [reminders.pourId, reminders.key] });
}

/** A deleted pour's reminders that have not gone out stop here, and so do their waiting deliveries. */
export async function cancelReminders(tx: Transaction, pourId: string, at: Date): Promise<void> {
  const cancelled = await tx
    .update(reminders)
    .set({ cancelledAt: at })
    .where(and(eq(reminders.pourId, pourId), isNull(reminders.cancelledAt)))
    .returning({ id: reminders.id });
  if (cancelled.length === 0) return;
  await tx
    .update(reminderDeliveries)
    .set({ status: 'cancelled' })
    .where(
      and(
        inArray(
          reminderDeliveries.reminderId,
          cancelled.map((row) => row.id),
        ),
        eq(reminderDeliveries.status, 'waiting'),
      ),
    );
}
