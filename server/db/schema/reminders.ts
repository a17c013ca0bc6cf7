import { sql } from 'drizzle-orm';
import { index, integer, jsonb, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { REMINDER_CHANNELS, REMINDER_KINDS } from '../../../shared/reminder-preferences.js';
import { pours } from './pours.js';
import { users } from './users.js';
import { workshops } from './workshops.js';

/** What each member wants reminding of; no row means the defaults. */
export const reminderPreferences = pgTable('reminder_preferences', {
  userId: uuid('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  kinds: text('kinds', { enum: REMINDER_KINDS }).array().notNull(),
  channels: text('channels', { enum: REMINDER_CHANNELS }).array().notNull(),
  quietFrom: text('quiet_from'),
  quietUntil: text('quiet_until'),
  timeZone: text('time_zone').notNull(),
  /** How long before a recoat window closes its reminder comes. */
  recoatLeadMin: integer('recoat_lead_min').notNull().default(30),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A browser that asked for pushes: where to send them and the keys to encrypt them for it. */
export const pushSubscriptions = pgTable(
  'push_subscriptions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    endpoint: text('endpoint').notNull().unique(),
    p256dh: text('p256dh').notNull(),
    auth: text('auth').notNull(),
    /** "Phone", "Workshop laptop": how the member tells their devices apart. */
    label: text('label').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('push_subscriptions_user').on(table.userId)],
);

/**
 * A moment after a pour that earns a reminder. Written in the same transaction as the pour, so a
 * pour that rolls back leaves none and a replayed push makes none twice (unique per pour and key).
 */
export const reminders = pgTable(
  'reminders',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workshopId: uuid('workshop_id')
      .notNull()
      .references(() => workshops.id, { onDelete: 'cascade' }),
    pourId: uuid('pour_id')
      .notNull()
      .references(() => pours.id, { onDelete: 'cascade' }),
    key: text('key').notNull(),
    kind: text('kind', { enum: REMINDER_KINDS }).notNull(),
    dueAt: timestamp('due_at', { withTimezone: true }).notNull(),
    title: text('title').notNull(),
    body: text('body').notNull(),
    /** Set once every member's deliveries have been made out. */
    fannedOutAt: timestamp('fanned_out_at', { withTimezone: true }),
    cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
  },
  (table) => [
    uniqueIndex('reminders_pour_key').on(table.pourId, table.key),
    index('reminders_due')
      .on(table.dueAt)
      .where(sql`fanned_out_at IS NULL AND cancelled_at IS NULL`),
  ],
);

/**
 * One reminder to one member by one channel. Its key makes a second copy impossible; a worker
 * claims it with a row lock (SKIP LOCKED) and marks it sent in the same transaction.
 */
export const reminderDeliveries = pgTable(
  'reminder_deliveries',
  {
    /** `pour:<pour id>:<reminder key>` or `digest:<workshop id>:<ISO week>`. */
    subject: text('subject').notNull(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    channel: text('channel', { enum: REMINDER_CHANNELS }).notNull(),
    reminderId: uuid('reminder_id').references(() => reminders.id, { onDelete: 'cascade' }),
    /** After quiet hours, or after a failed try. */
    sendAfter: timestamp('send_after', { withTimezone: true }).notNull(),
    message: jsonb('message').$type<{ title: string; body: string; url: string }>().notNull(),
    status: text('status', { enum: ['waiting', 'sent', 'failed', 'cancelled'] })
      .notNull()
      .default('waiting'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
  },
  (table) => [
    primaryKey({ columns: [table.subject, table.userId, table.channel] }),
    index('reminder_deliveries_due')
      .on(table.sendAfter)
      .where(sql`status = 'waiting'`),
  ],
);

/** Keys the server makes once and every API process shares, e.g. the VAPID key pair. */
export const serverKeys = pgTable('server_keys', {
  name: text('name').primaryKey(),
  value: jsonb('value').$type<Record<string, string>>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});
