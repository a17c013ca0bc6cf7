import PgBoss from 'pg-boss';
import type { ServerContext } from '../context.js';
import { FAN_OUT_BATCH, fanOutDueReminders, sendDueDeliveries, type Sending } from './reminder-delivery.js';
import { queueShelfDigests } from './shelf-digest.js';
import { vapidKeys } from './vapid-keys.js';

export const REMINDER_QUEUE = 'reminders-due';
export const DIGEST_QUEUE = 'shelf-digest';

/** Makes out and sends everything due by the context's clock: what each tick of the queue does. */
export async function runDueReminders(ctx: ServerContext, sending: Sending): Promise<number> {
  const now = ctx.clock.now();
  while ((await fanOutDueReminders(ctx, now)) === FAN_OUT_BATCH);
  return sendDueDeliveries(ctx, now, sending);
}

export async function sendingFor(ctx: ServerContext): Promise<Sending> {
  return { vapid: await vapidKeys(ctx.db), vapidSubject: vapidSubject(ctx) };
}

/** A contact for push services: the site over HTTPS, else the address reminders come from. */
function vapidSubject(ctx: ServerContext): string {
  const { publicOrigin, mailFrom } = ctx.config;
  if (publicOrigin.startsWith('https://')) return publicOrigin;
  const address = /<([^>]+)>/.exec(mailFrom)?.[1] ?? mailFrom;
  return `mailto:${address}`;
}

export interface ReminderJobs {
  boss: PgBoss;
  stop(): Promise<void>;
}

/**
 * Runs the reminders on pg-boss in the app's own PostgreSQL (schema `pgboss`): a tick every minute
 * sends what is due, and a weekly job makes out the shelf digests (Monday 08:00 UTC). pg-boss keeps
 * one scheduled job per tick across every API process and hands each job to one worker; the
 * deliveries themselves are claimed with row locks, so a second process never sends one twice.
 */
export async function startReminderJobs(ctx: ServerContext, pollingIntervalSeconds = 2): Promise<ReminderJobs> {
  const boss = new PgBoss({ connectionString: ctx.config.databaseUrl, schema: 'pgboss', max: 2 });
  boss.on('error', (error) => ctx.log.error({ err: error }, 'reminder queue trouble'));
  await boss.start();
  await boss.createQueue(REMINDER_QUEUE, { name: REMINDER_QUEUE, policy: 'singleton' });
  await boss.createQueue(DIGEST_QUEUE, { name: DIGEST_QUEUE, policy: 'singleton' });
  await boss.schedule(REMINDER_QUEUE, '* * * * *');
  await boss.schedule(DIGEST_QUEUE, '0 8 * * 1', {}, { tz: 'UTC' });
  const sending = await sendingFor(ctx);
  await boss.work(REMINDER_QUEUE, { pollingIntervalSeconds }, async () => {
    await runDueReminders(ctx, sending);
  });
  await boss.work(DIGEST_QUEUE, { pollingIntervalSeconds }, async () => {
    await queueShelfDigests(ctx, ctx.clock.now());
    await runDueReminders(ctx, sending);
  });
  return { boss, stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }) };
}
