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
 * How a tick lost with its process is noticed: pg-boss counts a tick still running after
 * `tickExpirySeconds` as failed, and each process looks for such ticks every
 * `maintenanceIntervalSeconds`. The tick queue runs one tick at a time, so an API process that dies
 * mid-tick holds reminders up for at most about the two together (pg-boss's own 15 minutes, by
 * default). Expiring a slow tick that is in fact still running is harmless: deliveries are claimed
 * under row locks, so the next tick cannot send one twice.
 */
export interface LostTickTimings {
  tickExpirySeconds: number;
  maintenanceIntervalSeconds: number;
}
const LOST_TICK_TIMINGS: LostTickTimings = { tickExpirySeconds: 120, maintenanceIntervalSeconds: 60 };

/**
 * Runs the reminders on pg-boss in the app's own PostgreSQL (schema `pgboss`): a tick every minute
 * sends what is due, and a weekly job makes out the shelf digests (Monday 08:00 UTC). pg-boss keeps
 * one scheduled job per tick across every API process and hands each job to one worker; the
 * deliveries themselves are claimed with row locks, so a second process never sends one twice.
 */
export async function startReminderJobs(
  ctx: ServerContext,
  pollingIntervalSeconds = 2,
  lost: LostTickTimings = LOST_TICK_TIMINGS,
): Promise<ReminderJobs> {
  const boss = new PgBoss({
    connectionString: ctx.config.databaseUrl,
    schema: 'pgboss',
    max: 2,
    maintenanceIntervalSeconds: lost.maintenanceIntervalSeconds,
  });
  boss.on('error', (error) => ctx.log.error({ err: error }, 'reminder queue trouble'));
  await boss.start();
  await oneProcessAtATime(ctx, async () => {
    for (const name of [REMINDER_QUEUE, DIGEST_QUEUE]) {
      // No retries: a lost or failed tick's work is what the next minute's tick does anyway.
      const queue = { name, policy: 'singleton', expireInSeconds: lost.tickExpirySeconds, retryLimit: 0 } as const;
      await boss.createQueue(name, queue);
      // A queue made by an earlier version keeps its old settings unless told.
      await boss.updateQueue(name, queue);
    }
    await boss.schedule(REMINDER_QUEUE, '* * * * *');
    await boss.schedule(DIGEST_QUEUE, '0 8 * * 1', {}, { tz: 'UTC' });
  });
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

/** Any fixed number: the advisory lock the API processes take to set the queues up. */
const QUEUE_SETUP_LOCK = 7_305_421_961;

/**
 * pg-boss makes a queue's table and its constraints in one function that deadlocks when two
 * processes make the same queue at once (a fresh database, every process starting together), and the
 * loser would exit. The set-up is quick, so the processes take turns under an advisory lock.
 */
async function oneProcessAtATime(ctx: ServerContext, work: () => Promise<void>): Promise<void> {
  const client = await ctx.pool.connect();
  try {
    await client.query('SELECT pg_advisory_lock($1)', [QUEUE_SETUP_LOCK]);
    await work();
  } finally {
    await client.query('SELECT pg_advisory_unlock($1)', [QUEUE_SETUP_LOCK]).catch(() => undefined);
    client.release();
  }
}
