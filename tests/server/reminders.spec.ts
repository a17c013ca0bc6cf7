import { and, eq } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import { pushSubscriptions, reminderDeliveries, reminderPreferences, reminders } from '../../server/db/schema/index.js';
import {
  REMINDER_QUEUE,
  runDueReminders,
  sendingFor,
  startReminderJobs,
} from '../../server/reminders/reminder-jobs.js';
import { queueShelfDigests } from '../../server/reminders/shelf-digest.js';
import { subscribe } from '../../server/reminders/reminder-settings.js';
import {
  FAN_OUT_BATCH,
  fanOutDueReminders,
  sendDueDeliveries,
  type Sending,
} from '../../server/reminders/reminder-delivery.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { startFakePushService, type FakePushService } from '../support/fake-push-service.js';
import { addBuild, addContainer, addMaterial, api, pourBody, type Api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { TEST_DATABASE_URL } from '../support/test-database.js';
import { openDatabase } from '../../server/db/database.js';

// TEST_DATA_SHEET (tests/support/shelf.ts, invented): recoat 240 min, demould 1440 min, full cure
// 4320 min at 20 °C, at most 10 mm a layer. A 15 mm pour at 20 °C is two layers of 7.5 mm, so
// its reminder is layer 2 at +240 min; demould and full cure count from the last layer, so come once
// layer 2 is recorded. A 4 mm pour is one layer: demould at +1440 min, full cure at +4320 min.
describe('cure reminders', () => {
  // Each tick sweeps every reminder due in the run's shared database, other suites' pours included.
  const SWEEP_MS = 30_000;
  let server: TestServer;
  let push: FakePushService;
  let sending: Sending;
  let owner: TestAccount;
  let builder: TestAccount;
  let viewer: TestAccount;
  let client: Api;
  let workshopId: string;
  let buildId: string;
  let materialId: string;

  beforeAll(async () => {
    server = await testServer();
    push = await startFakePushService();
    sending = await sendingFor(server.ctx);
    owner = await makeAccount(server.ctx, 'Ines');
    builder = await makeAccount(server.ctx, 'Tomas');
    viewer = await makeAccount(server.ctx, 'Priya');
    workshopId = (await makeWorkshop(server.ctx, owner, 'Reminder club')).id;
    await addMember(server.ctx, workshopId, builder, 'builder');
    await addMember(server.ctx, workshopId, viewer, 'viewer');
    client = api(server, builder, workshopId);
    buildId = await addBuild(client, { name: 'Causeway at Dunmere' });
    materialId = await addMaterial(client);
    await addContainer(client, materialId, { part: 'A', sizeQty: 5000 });
    await addContainer(client, materialId, { part: 'B', sizeQty: 5000 });
  });

  afterAll(() => push.close());

  beforeEach(async () => {
    push.received.length = 0;
    push.refused.length = 0;
    push.answerWith(null);
    for (const account of [owner, builder, viewer]) await choose(account, ['email'], null);
    await server.ctx.db.delete(pushSubscriptions).where(eq(pushSubscriptions.userId, builder.id));
  });

  async function choose(
    account: TestAccount,
    channels: ('email' | 'push')[],
    quietHours: { from: string; until: string } | null,
  ): Promise<void> {
    const values = { kinds: ['next-layer-due', 'demould', 'full-cure', 'shelf-digest'] as const, channels, quietHours };
    const row = {
      kinds: [...values.kinds],
      channels,
      quietFrom: quietHours?.from ?? null,
      quietUntil: quietHours?.until ?? null,
      timeZone: 'UTC',
    };
    await server.ctx.db
      .insert(reminderPreferences)
      .values({ userId: account.id, ...row })
      .onConflictDoUpdate({ target: reminderPreferences.userId, set: row });
  }

  async function logPour(note: string, depthMm = 15): Promise<{ id: string; startMs: number }> {
    const startMs = server.clock.now().getTime();
    const body = pourBody(buildId, materialId, { depthMm, note, startAt: new Date(startMs).toISOString() });
    await client.post('/pours', body).expect(201);
    return { id: body.id, startMs };
  }

  function mailTo(account: TestAccount, about: string) {
    return server.mail.messages.filter((m) => m.to.includes(account.email) && m.text.includes(about));
  }

  async function tick(): Promise<void> {
    await runDueReminders(server.ctx, sending);
  }

  it(
    'should schedule a pour’s moments when it reaches the server',
    async () => {
      const pour = await logPour('Scheduled pool');
      const rows = await server.ctx.db.select().from(reminders).where(eq(reminders.pourId, pour.id));
      const byKey = Object.fromEntries(rows.map((row) => [row.key, row.dueAt.getTime() - pour.startMs]));
      const minutes = 60_000;
      expect(byKey).toEqual({ 'next-layer-due:2': 240 * minutes });
    },
    SWEEP_MS,
  );

  it(
    'should e-mail the owner and the builder once when the next layer is due, and never the viewer',
    async () => {
      await logPour('Mill leat');
      server.clock.advanceMinutes(239);
      await tick();
      expect(mailTo(builder, 'Mill leat')).toEqual([]);

      server.clock.advanceMinutes(2);
      await tick();
      await server.mail.waitFor(builder.email, (m) => m.text.includes('Mill leat'));
      await server.mail.waitFor(owner.email, (m) => m.text.includes('Mill leat'));
      await tick();
      await new Promise((resolve) => setTimeout(resolve, 300));
      expect(mailTo(builder, 'Mill leat').length).toBe(1);
      expect(mailTo(owner, 'Mill leat').length).toBe(1);
      expect(mailTo(viewer, 'Mill leat')).toEqual([]);
      const [message] = mailTo(builder, 'Mill leat');
      expect(message!.subject).toBe('Layer 2 of 2 can go on');
      expect(message!.text).toContain('/builds/' + buildId + '?pour=');
    },
    SWEEP_MS,
  );

  it(
    'should push to a subscribed browser, checked and decrypted by the push service',
    async () => {
      await choose(builder, ['push'], null);
      await subscribe(server.ctx, builder.id, { ...push.subscribe('tomas-phone'), label: 'Phone' });
      const pour = await logPour('Sluice pool');
      server.clock.advanceMinutes(241);
      await tick();
      await tick();
      const mine = push.received.filter((p) => p.payload.includes('Sluice pool'));
      expect(mine.length).toBe(1);
      expect(mine[0]!.device).toBe('tomas-phone');
      const { notification } = JSON.parse(mine[0]!.payload) as {
        notification: { title: string; data: { url: string } };
      };
      expect(notification.title).toBe('Layer 2 of 2 can go on');
      expect(notification.data.url).toBe(`/builds/${buildId}?pour=${pour.id}`);
      expect(push.refused).toEqual([]);
    },
    SWEEP_MS,
  );

  it(
    'should cancel the reminders of a deleted pour',
    async () => {
      const pour = await logPour('Deleted pool');
      await client.delete(`/pours/${pour.id}`).expect(204);
      server.clock.advanceMinutes(5000);
      await tick();
      await new Promise((resolve) => setTimeout(resolve, 300));
      expect(mailTo(builder, 'Deleted pool')).toEqual([]);
      const rows = await server.ctx.db.select().from(reminders).where(eq(reminders.pourId, pour.id));
      expect(rows.every((row) => row.cancelledAt !== null)).toBeTrue();
    },
    SWEEP_MS,
  );

  it(
    'should hold a reminder due in quiet hours until they end',
    async () => {
      // Quiet from the next minute for two hours, on the test clock in UTC.
      const now = server.clock.now();
      const hhmm = (date: Date) => date.toISOString().slice(11, 16);
      const from = new Date(now.getTime() + 239 * 60_000);
      const until = new Date(now.getTime() + 360 * 60_000);
      await choose(builder, ['email'], { from: hhmm(from), until: hhmm(until) });
      await logPour('Quiet pool');
      server.clock.advanceMinutes(245);
      await tick();
      await new Promise((resolve) => setTimeout(resolve, 300));
      expect(mailTo(builder, 'Quiet pool')).toEqual([]);
      await server.mail.waitFor(owner.email, (m) => m.text.includes('Quiet pool'));

      server.clock.advanceMinutes(120);
      await tick();
      await server.mail.waitFor(builder.email, (m) => m.text.includes('Quiet pool'));
      expect(mailTo(builder, 'Quiet pool').length).toBe(1);
    },
    SWEEP_MS,
  );

  it(
    'should try a failed push again later and deliver it exactly once',
    async () => {
      await choose(builder, ['push'], null);
      await subscribe(server.ctx, builder.id, { ...push.subscribe('retry-phone'), label: '' });
      await logPour('Retry pool');
      push.answerWith(503);
      server.clock.advanceMinutes(241);
      await tick();
      expect(push.received.filter((p) => p.payload.includes('Retry pool'))).toEqual([]);
      const [waiting] = await server.ctx.db
        .select()
        .from(reminderDeliveries)
        .where(and(eq(reminderDeliveries.userId, builder.id), eq(reminderDeliveries.status, 'waiting')));
      expect(waiting?.lastError).toBe('the push service answered 503');

      push.answerWith(null);
      await tick();
      expect(push.received.filter((p) => p.payload.includes('Retry pool'))).toEqual([]);
      server.clock.advanceMinutes(2);
      await tick();
      await tick();
      expect(push.received.filter((p) => p.payload.includes('Retry pool')).length).toBe(1);
    },
    SWEEP_MS,
  );

  it(
    'should reach a good browser and forget one whose keys cannot be used, without stopping',
    async () => {
      await choose(builder, ['push'], null);
      await subscribe(server.ctx, builder.id, { ...push.subscribe('good-phone'), label: '' });
      // Kept before keys were checked on the way in: web-push cannot encrypt for it.
      await server.ctx.db.insert(pushSubscriptions).values({
        userId: builder.id,
        endpoint: `${push.origin}/push/broken`,
        p256dh: 'BPxq3Jm0Jd8',
        auth: 'c2VjcmV0',
      });
      await logPour('Broken key pool');
      server.clock.advanceMinutes(241);
      await tick();
      expect(push.received.filter((p) => p.payload.includes('Broken key pool')).map((p) => p.device)).toEqual([
        'good-phone',
      ]);
      const left = await server.ctx.db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, builder.id));
      expect(left.map((row) => row.endpoint)).toEqual([`${push.origin}/push/good-phone`]);
    },
    SWEEP_MS,
  );

  it(
    'should forget a browser that unsubscribed (410)',
    async () => {
      await choose(builder, ['push'], null);
      const gone = push.subscribe('old-laptop');
      await subscribe(server.ctx, builder.id, { ...gone, label: '' });
      await logPour('Gone pool');
      push.answerWith(410);
      server.clock.advanceMinutes(241);
      await tick();
      const left = await server.ctx.db.query.pushSubscriptions.findMany({
        where: (table, { eq: equals }) => equals(table.endpoint, gone.endpoint),
      });
      expect(left).toEqual([]);
    },
    SWEEP_MS,
  );

  it('should send each reminder exactly once with two workers running at once', async () => {
    await choose(builder, ['push'], null);
    await subscribe(server.ctx, builder.id, { ...push.subscribe('race-phone'), label: '' });
    for (let i = 0; i < 12; i += 1) await logPour(`Race pool ${i}`, 4);
    server.clock.advanceMinutes(5000);
    // Everything is due and made out; then three workers, one of them in a second API process
    // (its own pool of connections to the same database), send at the same moment.
    const now = server.clock.now();
    while ((await fanOutDueReminders(server.ctx, now)) === FAN_OUT_BATCH);
    const other = openDatabase(TEST_DATABASE_URL);
    try {
      const counts = await Promise.all([
        sendDueDeliveries(server.ctx, now, sending),
        sendDueDeliveries({ ...server.ctx, db: other.db, pool: other.pool }, now, sending),
        sendDueDeliveries(server.ctx, now, sending),
      ]);
      expect(counts.reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(24);
    } finally {
      await other.pool.end();
    }
    for (let i = 0; i < 12; i += 1) {
      const sent = push.received.filter((p) => p.payload.includes(`Race pool ${i} on`));
      // Two moments each of these one-layer pours: demould, full cure.
      expect(sent.length).withContext(`Race pool ${i}`).toBe(2);
    }
  }, 30_000);

  it(
    'should send the weekly shelf digest once a week per member, naming what needs a look',
    async () => {
      // A fresh workshop so only its own shelf counts: one part low (120 g left of 500, warn at 150).
      const shelfClub = (await makeWorkshop(server.ctx, owner, 'Digest club')).id;
      const shelf = api(server, owner, shelfClub);
      const resin = await addMaterial(shelf, { name: 'Digest resin' });
      await addContainer(shelf, resin, { part: 'A', sizeQty: 120, lowStockQty: 150 });
      await addContainer(shelf, resin, { part: 'B', sizeQty: 500, lowStockQty: 150 });
      const now = server.clock.now();
      await queueShelfDigests(server.ctx, now);
      await queueShelfDigests(server.ctx, now);
      await tick();
      const digest = await server.mail.waitFor(owner.email, (m) => m.text.includes('Digest resin'));
      expect(digest.subject).toBe('One thing on the shelf needs a look');
      expect(digest.text).toContain('Digest resin part A: low, 120 g left');
      await tick();
      await new Promise((resolve) => setTimeout(resolve, 300));
      expect(mailTo(owner, 'Digest resin').length).toBe(1);
    },
    SWEEP_MS,
  );

  it('should run on pg-boss: a queued tick in either of two API processes sends what is due, once', async () => {
    await choose(builder, ['push'], null);
    await subscribe(server.ctx, builder.id, { ...push.subscribe('queue-phone'), label: '' });
    await logPour('Queue pool');
    server.clock.advanceMinutes(241);
    const config = { ...server.ctx.config, databaseUrl: TEST_DATABASE_URL };
    const other = openDatabase(TEST_DATABASE_URL);
    const processes = [
      await startReminderJobs({ ...server.ctx, config }, 0.5),
      await startReminderJobs({ ...server.ctx, config, db: other.db, pool: other.pool }, 0.5),
    ];
    try {
      await processes[0]!.boss.send(REMINDER_QUEUE, {});
      await processes[1]!.boss.send(REMINDER_QUEUE, {});
      const deadline = Date.now() + 15_000;
      while (!push.received.some((p) => p.payload.includes('Queue pool')) && Date.now() < deadline) {
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
      await new Promise((resolve) => setTimeout(resolve, 1500));
      expect(push.received.filter((p) => p.payload.includes('Queue pool on')).length).toBe(1);
    } finally {
      for (const running of processes) await running.stop();
      await other.pool.end();
    }
  }, 40_000);

  it('should not let a tick lost with its process hold reminders up for long', async () => {
    await choose(builder, ['push'], null);
    await subscribe(server.ctx, builder.id, { ...push.subscribe('lost-tick-phone'), label: '' });
    await logPour('Lost tick pool');
    server.clock.advanceMinutes(241);
    // Short timings so the spec is quick; the app's are 120 s and 60 s.
    const lost = { tickExpirySeconds: 1, maintenanceIntervalSeconds: 1 };
    const config = { ...server.ctx.config, databaseUrl: TEST_DATABASE_URL };
    // The app's start-up sets how long a tick may run; this first process stops at once.
    await (await startReminderJobs({ ...server.ctx, config }, 0.5, lost)).stop();
    // A process takes a tick and dies before finishing it: the job stays active, and the queue runs
    // one tick at a time, so nothing else would run until pg-boss counts it lost.
    const dying = new PgBoss({
      connectionString: TEST_DATABASE_URL,
      schema: 'pgboss',
      supervise: false,
      schedule: false,
    });
    await dying.start();
    await dying.send(REMINDER_QUEUE, {});
    expect((await dying.fetch(REMINDER_QUEUE)).length).toBe(1);
    const survivor = await startReminderJobs({ ...server.ctx, config }, 0.5, lost);
    try {
      await survivor.boss.send(REMINDER_QUEUE, {});
      const deadline = Date.now() + 20_000;
      while (!push.received.some((p) => p.payload.includes('Lost tick pool')) && Date.now() < deadline) {
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
      expect(push.received.filter((p) => p.payload.includes('Lost tick pool on')).length).toBe(1);
    } finally {
      await survivor.stop();
      await dying.stop({ graceful: false, wait: true });
    }
  }, 40_000);
});
