import { inArray, sql } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import { v7 } from 'uuid';
import { REMINDER_KINDS } from '../../shared/reminder-preferences.js';
import { pourReminderTag } from '../../shared/pour-reminders.js';
import type { PullAnswer, PulledChange } from '../../shared/sync-schemas.js';
import { reminderDeliveries, reminders } from '../../server/db/schema/index.js';
import { REMINDER_QUEUE } from '../../server/reminders/reminder-jobs.js';
import { savePreferences, subscribe } from '../../server/reminders/reminder-settings.js';
import { startAppServer, type RunningApp } from '../e2e/support/app-server.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { startFakePushService, type FakePushService } from '../support/fake-push-service.js';
import { TEST_DATA_SHEET } from '../support/shelf.js';
import { testPhotoDir, testServer, type TestServer } from '../support/test-app.js';
import { TEST_DATABASE_URL } from '../support/test-database.js';

/** Where people would reach both processes: the load balancer's address, never either process's own. */
const BALANCER = 'http://benchtide-balancer.test';
const DAY_MS = 24 * 3_600_000;

type Page = Extract<PullAnswer, { startOver: false }>;

// TEST_DATA_SHEET (tests/support/shelf.ts, invented): a 15 mm pour at 20 °C is two layers. Each pour
// started four days ago and its layer 2 went on 250 min later, so it earns two reminders (demould and
// full cure, counted from layer 2), both due; the one for layer 2 itself is cancelled before it goes.
describe('two API processes on one database', () => {
  const buildId = v7();
  const stepIds = [v7(), v7()];
  const materialId = v7();
  const containerIds = [v7(), v7()];
  /** Four pours, so a tick has enough to send that the two processes' ticks overlap. */
  const pours = ['Weir pool', 'Mill pond', 'Tail race', 'Sluice'].map((note) => ({ id: v7(), note }));
  const pourIds = pours.map((pour) => pour.id);
  let server: TestServer;
  let push: FakePushService;
  let sender: PgBoss;
  let a: RunningApp;
  let b: RunningApp;
  let owner: TestAccount;
  let builder: TestAccount;
  let workshopId: string;
  /** The owner's session, signed in on A and used on B. */
  let cookie: string;
  /** When the pours reached the server: the reminder ticks of this spec start after it. */
  let pouredAt: Date;
  /** The reminder ticks this spec queued. */
  let ticks: (string | null)[];

  function call(on: RunningApp, method: string, path: string, session?: string, body?: unknown): Promise<Response> {
    return fetch(`${on.origin}/api${path}`, {
      method,
      headers: {
        // What a browser on the balancer's page sends with each request.
        'Sec-Fetch-Site': 'same-origin',
        ...(method === 'GET' ? {} : { Origin: BALANCER }),
        ...(session ? { Cookie: session } : {}),
        ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  }

  async function signIn(on: RunningApp): Promise<string> {
    const response = await call(on, 'POST', '/auth/sign-in', undefined, {
      email: owner.email,
      password: owner.password,
    });
    expect(response.status).withContext('sign-in').toBe(200);
    return response.headers.getSetCookie()[0]!.split(';')[0]!;
  }

  async function pushChanges(on: RunningApp, mutations: object[]): Promise<void> {
    const response = await call(on, 'POST', '/sync/push', cookie, { workshopId, mutations });
    expect(response.status).withContext('push').toBe(200);
    const { results } = (await response.json()) as { results: { status: string }[] };
    expect(results.map((result) => result.status)).toEqual(mutations.map(() => 'applied'));
  }

  async function pull(on: RunningApp, after = 0): Promise<Page> {
    const response = await call(on, 'GET', `/sync/pull?workshopId=${workshopId}&after=${after}`, cookie);
    expect(response.status).withContext('pull').toBe(200);
    const page = (await response.json()) as Page;
    expect(page.more).toBeFalse();
    return page;
  }

  const idsOf = (changes: readonly PulledChange[]) => changes.map((change) => `${change.entity}:${change.record.id}`);

  beforeAll(async () => {
    server = await testServer();
    push = await startFakePushService();
    const env = {
      PUBLIC_ORIGIN: BALANCER,
      SMTP_URL: `smtp://127.0.0.1:${server.mail.port}`,
      PHOTO_DIR: testPhotoDir(),
      REMINDER_JOBS: 'on',
    };
    // Started together, as a deploy starts its processes: both migrate, and both start pg-boss.
    [a, b] = await Promise.all([startAppServer(env), startAppServer(env)]);
    sender = new PgBoss({
      connectionString: TEST_DATABASE_URL,
      schema: 'pgboss',
      max: 1,
      supervise: false,
      schedule: false,
      migrate: false,
    });
    await sender.start();

    owner = await makeAccount(server.ctx, 'Marit');
    builder = await makeAccount(server.ctx, 'Oskar');
    workshopId = (await makeWorkshop(server.ctx, owner, 'Weir club')).id;
    await addMember(server.ctx, workshopId, builder, 'builder');
    await savePreferences(server.ctx, builder.id, {
      kinds: [...REMINDER_KINDS],
      channels: ['email'],
      quietHours: null,
      timeZone: 'UTC',
    });

    cookie = await signIn(a);
    const preferences = { kinds: [...REMINDER_KINDS], channels: ['email', 'push'], quietHours: null, timeZone: 'UTC' };
    expect((await call(b, 'PUT', '/account/reminders', cookie, preferences)).status).toBe(200);
    // A production server takes only https push addresses, so the stand-in's is kept from here.
    await subscribe(server.ctx, owner.id, { ...push.subscribe('marit-phone'), label: 'Phone' });

    pouredAt = new Date();
    const startMs = Date.now() - 4 * DAY_MS;
    await pushChanges(b, [
      {
        type: 'build.create',
        mutationId: v7(),
        data: { id: buildId, name: 'Weir at Harrowby', scaleRatio: 87.1, status: 'building' },
      },
      {
        type: 'step.create',
        mutationId: v7(),
        data: {
          id: stepIds[0],
          buildId,
          kind: 'base-and-terrain',
          title: 'Carved the river bed',
          happenedAt: new Date(Date.now() - 6 * DAY_MS).toISOString(),
        },
      },
      {
        type: 'step.create',
        mutationId: v7(),
        data: {
          id: stepIds[1],
          buildId,
          kind: 'water-pour',
          title: 'Sealed the dam walls',
          happenedAt: new Date(Date.now() - 5 * DAY_MS).toISOString(),
        },
      },
      {
        type: 'material.create',
        mutationId: v7(),
        data: { id: materialId, name: 'Test resin', kind: 'two-part-epoxy', dataSheet: TEST_DATA_SHEET },
      },
      ...(['A', 'B'] as const).map((part, i) => ({
        type: 'container.create',
        mutationId: v7(),
        data: {
          id: containerIds[i],
          materialId,
          part,
          sizeQty: 500,
          unit: 'g',
          priceMinor: 2500,
          currency: 'EUR',
          boughtOn: '2026-10-01',
        },
      })),
      ...pours.map(({ id, note }) => ({
        type: 'pour.create',
        mutationId: v7(),
        data: {
          id,
          buildId,
          stepId: stepIds[1],
          materialId,
          shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
          depthMm: 15,
          roomTempC: 20,
          startAt: new Date(startMs).toISOString(),
          note,
        },
      })),
      ...pours.map(({ id }) => ({
        type: 'pourLayer.create',
        mutationId: v7(),
        data: {
          id: v7(),
          pourId: id,
          number: 2,
          pouredAt: new Date(startMs + 250 * 60_000).toISOString(),
          roomTempC: 20,
        },
      })),
    ]);
    // pg-boss ticks once a minute; these ticks go out now instead. Each has its own key, so the
    // singleton queue lets both processes run one at the same time; a slow push service keeps a
    // tick at work long enough (a quarter second a push) for the other process to start one too.
    push.answerAfter(250);
    ticks = await Promise.all(
      [0, 1, 2, 3].map((i) => sender.send(REMINDER_QUEUE, {}, { singletonKey: `two-processes-${workshopId}-${i}` })),
    );
  }, 45_000);

  afterAll(async () => {
    await Promise.all([a?.stop(), b?.stop(), sender?.stop({ graceful: false, wait: true }), push?.close()]);
  }, 30_000);

  it('should pull the same changes from either process, and see on B what was written on A', async () => {
    const [fromA, fromB] = [await pull(a), await pull(b)];

    expect(fromB).toEqual(fromA);
    expect(idsOf(fromA.changes)).toEqual(
      jasmine.arrayContaining([
        `build:${buildId}`,
        ...stepIds.map((id) => `step:${id}`),
        `material:${materialId}`,
        ...containerIds.map((id) => `container:${id}`),
        ...pourIds.map((id) => `pour:${id}`),
      ]),
    );

    const thirdStep = v7();
    await pushChanges(a, [
      { type: 'build.patch', mutationId: v7(), recordId: buildId, data: { notes: 'Second layer next.' } },
      {
        type: 'step.create',
        mutationId: v7(),
        data: {
          id: thirdStep,
          buildId,
          kind: 'detailing',
          title: 'Reeds at the bank',
          happenedAt: '2026-11-30T09:00:00Z',
        },
      },
    ]);
    const laterOnB = await pull(b, fromA.cursor);

    expect(laterOnB.cursor).toBeGreaterThan(fromA.cursor);
    expect(idsOf(laterOnB.changes).sort()).toEqual([`build:${buildId}`, `step:${thirdStep}`].sort());
    expect(laterOnB.changes.find((change) => change.entity === 'build')!.record['notes']).toBe('Second layer next.');
    expect(await pull(a, fromA.cursor)).toEqual(laterOnB);
  });

  it('should end a session on every process when it is signed out on one', async () => {
    const phone = await signIn(a);
    expect((await call(b, 'GET', '/account', phone)).status).toBe(200);

    expect((await call(b, 'POST', '/auth/sign-out', phone)).status).toBe(204);

    expect((await call(a, 'GET', '/account', phone)).status).toBe(401);
    expect((await call(a, 'GET', `/sync/pull?workshopId=${workshopId}`, phone)).status).toBe(401);
    // The owner's other session, signed in on A too, goes on.
    expect((await call(b, 'GET', '/account', cookie)).status).toBe(200);
  });

  it('should hand out one push key, whichever process is asked', async () => {
    const keys = await Promise.all([a, b].map(async (on) => (await call(on, 'GET', '/reminders/push-key')).json()));

    expect(keys[1]).toEqual(keys[0]);
  });

  it('should send each due reminder once to each member and channel, though both processes run the workers', async () => {
    const all = await server.ctx.db.select().from(reminders).where(inArray(reminders.pourId, pourIds));
    const due = all.filter((reminder) => reminder.cancelledAt === null);
    expect(due.map((reminder) => reminder.key).sort()).toEqual(pours.flatMap(() => ['demould', 'full-cure']).sort());
    expect(all.filter((reminder) => reminder.cancelledAt !== null).map((reminder) => reminder.key)).toEqual(
      pours.map(() => 'next-layer-due:2'),
    );
    const wanted = due.flatMap((reminder) => [
      `${reminder.id} ${owner.id} email`,
      `${reminder.id} ${owner.id} push`,
      `${reminder.id} ${builder.id} email`,
    ]);
    const ours = (to: TestAccount) =>
      server.mail.messages.filter((m) => m.to.includes(to.email) && pourIds.some((id) => m.text.includes(id)));

    const deliveries = () =>
      server.ctx.db
        .select()
        .from(reminderDeliveries)
        .where(
          inArray(
            reminderDeliveries.reminderId,
            due.map((reminder) => reminder.id),
          ),
        );
    const settled = async () => {
      const jobs = await Promise.all(ticks.map((id) => sender.getJobById(REMINDER_QUEUE, id!)));
      const rows = await deliveries();
      return (
        jobs.every((job) => job?.state === 'completed') &&
        rows.length === wanted.length &&
        rows.every((delivery) => delivery.status === 'sent') &&
        ours(owner).length + ours(builder).length >= due.length * 2
      );
    };
    const deadline = Date.now() + 30_000;
    while (!(await settled())) {
      if (Date.now() > deadline) throw new Error('not everything due was sent within 30 s');
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
    const sent = await deliveries();

    // The premise: ticks in both processes were at work at once (each process has one worker).
    const overlapping = await server.ctx.db.execute(sql`
      SELECT count(*)::int AS pairs FROM pgboss.job first JOIN pgboss.job second
        ON first.id < second.id AND first.started_on < second.completed_on AND second.started_on < first.completed_on
      WHERE first.name = ${REMINDER_QUEUE} AND second.name = ${REMINDER_QUEUE}
        AND first.started_on >= ${pouredAt} AND second.started_on >= ${pouredAt}`);
    expect(overlapping.rows[0]!['pairs']).withContext('ticks running at once').toBeGreaterThan(0);

    expect(sent.map((d) => `${d.reminderId} ${d.userId} ${d.channel}`).sort()).toEqual(wanted.sort());
    // Layer 2 was on before any tick: its reminder went to nobody, by either process.
    const cancelledIds = all.filter((reminder) => reminder.cancelledAt !== null).map((reminder) => reminder.id);
    expect(
      await server.ctx.db.select().from(reminderDeliveries).where(inArray(reminderDeliveries.reminderId, cancelledIds)),
    ).toEqual([]);
    expect(push.received.filter((p) => p.payload.includes('next-layer-due:2'))).toEqual([]);
    // One attempt each: no second worker ever claimed a delivery the first had sent.
    expect(sent.every((delivery) => delivery.status === 'sent' && delivery.attempts === 1)).toBeTrue();
    for (const reminder of due) {
      const link = `${BALANCER}/builds/${buildId}?pour=${reminder.pourId}`;
      for (const member of [owner, builder]) {
        const mails = ours(member).filter((m) => m.subject === reminder.title && m.text.includes(link));
        expect(mails.length).withContext(`${reminder.key} of ${reminder.pourId} to ${member.displayName}`).toBe(1);
      }
      const pushes = push.received.filter((p) => p.payload.includes(pourReminderTag(reminder.pourId, reminder.key)));
      expect(pushes.map((p) => p.device))
        .withContext(`${reminder.key} of ${reminder.pourId} pushed`)
        .toEqual(['marit-phone']);
    }
    expect(ours(owner).length + ours(builder).length).toBe(due.length * 2);
    expect(push.refused).toEqual([]);
  }, 40_000);
});
