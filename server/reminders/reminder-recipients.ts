import { and, eq, inArray } from 'drizzle-orm';
import {
  defaultReminderPreferences,
  type ReminderChannel,
  type ReminderKind,
  type ReminderPreferences,
} from '../../shared/reminder-preferences.js';
import { ROLES } from '../../shared/account-schemas.js';
import { may } from '../../shared/workshop-policy.js';
import { reminderPreferences, pushSubscriptions } from '../db/schema/reminders.js';
import { users } from '../db/schema/users.js';
import { memberships } from '../db/schema/workshops.js';
import type { Transaction } from '../records/change-stamp.js';

export interface Recipient {
  userId: string;
  channels: ReminderChannel[];
  preferences: ReminderPreferences;
}

/** Roles that pour and restock, so the ones a reminder is for; viewers follow the log instead. */
const REMINDED_ROLES = ROLES.filter((role) => may(role, 'write-builds'));

/** Members of a workshop who want this kind of reminder, each with the channels that can reach them. */
export async function recipientsOf(tx: Transaction, workshopId: string, kind: ReminderKind): Promise<Recipient[]> {
  const members = await tx
    .select({ userId: users.id, verifiedAt: users.emailVerifiedAt, preferences: reminderPreferences })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .leftJoin(reminderPreferences, eq(reminderPreferences.userId, users.id))
    .where(and(eq(memberships.workshopId, workshopId), inArray(memberships.role, REMINDED_ROLES)));
  if (members.length === 0) return [];
  const subscribed = new Set(
    (
      await tx
        .selectDistinct({ userId: pushSubscriptions.userId })
        .from(pushSubscriptions)
        .where(
          inArray(
            pushSubscriptions.userId,
            members.map((member) => member.userId),
          ),
        )
    ).map((row) => row.userId),
  );
  const recipients: Recipient[] = [];
  for (const member of members) {
    const preferences = preferencesFrom(member.preferences);
    if (!preferences.kinds.includes(kind)) continue;
    const channels = preferences.channels.filter((channel) =>
      channel === 'push' ? subscribed.has(member.userId) : member.verifiedAt !== null,
    );
    if (channels.length > 0) recipients.push({ userId: member.userId, channels, preferences });
  }
  return recipients;
}

export function preferencesFrom(row: typeof reminderPreferences.$inferSelect | null): ReminderPreferences {
  if (!row) return defaultReminderPreferences('UTC');
  return {
    kinds: row.kinds,
    channels: row.channels,
    quietHours: row.quietFrom && row.quietUntil ? { from: row.quietFrom, until: row.quietUntil } : null,
    timeZone: row.timeZone,
    recoatLeadMin: row.recoatLeadMin,
  };
}
