import { eq, inArray } from 'drizzle-orm';
import { v7 } from 'uuid';
import { reminderDeliveries, reminderPreferences, reminders } from '../../server/db/schema/index.js';
import { runDueReminders, sendingFor } from '../../server/reminders/reminder-jobs.js';
import type { Sending } from '../../server/reminders/reminder-delivery.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody, TEST_DATA_SHEET, type Api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

const MIN = 60_000;

// TEST_DATA_SHEET (tests/support/shelf.ts, invented) with a recoat window of 240–480 min at 20 °C.
// A 25 mm pour is three layers (at most 10 mm each). Worked by hand, from each layer's real time:
// layer 2 can go on at +240 min and its window closes at +480; once layer 2 is on at +300, layer 3 is
// due at +540 and its window closes at +780. A member with the default lead (30 min) hears of a window
// closing at +480 at +450; one with a 90 min lead at +390.
describe('reminders that follow the real layers', () => {
  const SWEEP_MS = 30_000;
  let server: TestServer;
  let sending: Sending;
  let owner: TestAccount;
  let builder: TestAccount;
  let client: Api;
  let buildId: string;
  let materialId: string;

  beforeAll(async () => {
    server = await testServer();
    sending = await sendingFor(server.ctx);
    owner = await makeAccount(server.ctx, 'Aoife');
    builder = await makeAccount(server.ctx, 'Dara');
    const workshopId = (await makeWorkshop(server.ctx, owner, 'Layer club')).id;
    await addMember(server.ctx, workshopId, builder, 'builder');
    client = api(server, builder, workshopId);
    buildId = await addBuild(client, { name: 'Ford at Kilbride' });
    materialId = await addMaterial(client, { dataSheet: { ...TEST_DATA_SHEET, recoatMaxMin: 480 } });
    await addContainer(client, materialId, { part: 'A', sizeQty: 5000 });
    await addContainer(client, materialId, { part: 'B', sizeQty: 5000 });
    for (const [account, lead] of [
      [owner, null],
      [builder, 90],
    ] as const) {
      const row = {
        kinds: ['next-layer-due' as const, 'recoat-window-closes' as const],
        channels: ['email' as const],
        quietFrom: null,
        quietUntil: null,
        timeZone: 'UTC',
        ...(lead === null ? {} : { recoatLeadMin: lead }),
      };
      await server.ctx.db.insert(reminderPreferences).values({ userId: account.id, ...row });
    }
  });

  async function logPour(note: string) {
    const startMs = server.clock.now().getTime();
    const body = pourBody(buildId, materialId, { depthMm: 25, note, startAt: new Date(startMs).toISOString() });
    await client.post('/pours', body).expect(201);
    return { id: body.id, startMs };
  }

  async function remindersOf(pourId: string) {
    const rows = await server.ctx.db.select().from(reminders).where(eq(reminders.pourId, pourId));
    return new Map(rows.map((row) => [row.key, row]));
  }

  async function deliveriesOf(reminderId: string) {
    const rows = await server.ctx.db
      .select()
      .from(reminderDeliveries)
      .where(eq(reminderDeliveries.reminderId, reminderId));
    return new Map(rows.map((row) => [row.userId, row]));
  }

  const mailsAbout = (account: TestAccount, subject: string, note: string) =>
    server.mail.messages.filter((m) => m.to.includes(account.email) && m.subject === subject && m.text.includes(note));

  it(
    'should send the recoat reminder at each member’s lead before the window closes',
    async () => {
      const pour = await logPour('Lead pool');
      await runDueReminders(server.ctx, sending);
      const closes = (await remindersOf(pour.id)).get('recoat-window-closes:2')!;
      expect(closes.dueAt.getTime() - pour.startMs).toBe(480 * MIN);
      const deliveries = await deliveriesOf(closes.id);
      expect(deliveries.get(owner.id)!.sendAfter.getTime() - pour.startMs).toBe(450 * MIN);
      expect(deliveries.get(builder.id)!.sendAfter.getTime() - pour.startMs).toBe(390 * MIN);

      server.clock.advanceMinutes(391);
      await runDueReminders(server.ctx, sending);
      const subject = 'Recoat window for layer 2 closing';
      expect(mailsAbout(builder, subject, 'Lead pool').length).toBe(1);
      expect(mailsAbout(owner, subject, 'Lead pool').length).toBe(0);

      server.clock.advanceMinutes(60);
      await runDueReminders(server.ctx, sending);
      expect(mailsAbout(owner, subject, 'Lead pool').length).toBe(1);
      expect(mailsAbout(builder, subject, 'Lead pool').length).toBe(1);
    },
    SWEEP_MS,
  );

  it(
    'should move the reminders to the real layer: layer 3 due from layer 2, none for layer 2 once it is on',
    async () => {
      const pour = await logPour('Moving pool');
      await runDueReminders(server.ctx, sending);
      const before = await remindersOf(pour.id);
      expect(before.get('next-layer-due:2')!.dueAt.getTime() - pour.startMs).toBe(240 * MIN);
      expect(before.has('next-layer-due:3')).toBeFalse();
      const closesTwo = before.get('recoat-window-closes:2')!;
      expect([...(await deliveriesOf(closesTwo.id)).values()].map((d) => d.status)).toEqual(['waiting', 'waiting']);

      server.clock.advanceMinutes(300);
      const layerId = v7();
      await client
        .post('/layers', {
          id: layerId,
          pourId: pour.id,
          number: 2,
          pouredAt: new Date(pour.startMs + 300 * MIN).toISOString(),
          roomTempC: 20,
        })
        .expect(201);

      const after = await remindersOf(pour.id);
      expect(after.get('next-layer-due:2')!.cancelledAt).not.toBeNull();
      expect(after.get('recoat-window-closes:2')!.cancelledAt).not.toBeNull();
      expect([...(await deliveriesOf(closesTwo.id)).values()].map((d) => d.status)).toEqual(['cancelled', 'cancelled']);
      expect(after.get('next-layer-due:3')!.dueAt.getTime() - pour.startMs).toBe(540 * MIN);
      expect(after.get('next-layer-due:3')!.cancelledAt).toBeNull();
      expect(after.get('recoat-window-closes:3')!.dueAt.getTime() - pour.startMs).toBe(780 * MIN);

      // Made out at once (within the longest lead); a corrected time moves its waiting deliveries.
      await runDueReminders(server.ctx, sending);
      const closesThree = after.get('recoat-window-closes:3')!;
      expect((await deliveriesOf(closesThree.id)).get(owner.id)!.sendAfter.getTime() - pour.startMs).toBe(750 * MIN);
      await client
        .patch(`/layers/${layerId}`, { pouredAt: new Date(pour.startMs + 320 * MIN).toISOString() })
        .expect(200);
      const moved = await deliveriesOf(closesThree.id);
      expect(moved.get(owner.id)!.sendAfter.getTime() - pour.startMs).toBe(770 * MIN);
      expect(moved.get(builder.id)!.sendAfter.getTime() - pour.startMs).toBe(710 * MIN);
      expect((await remindersOf(pour.id)).get('next-layer-due:3')!.dueAt.getTime() - pour.startMs).toBe(560 * MIN);

      // Past where layer 2's reminders would have gone: none of them ever does.
      server.clock.advanceMinutes(270);
      await runDueReminders(server.ctx, sending);
      for (const account of [owner, builder]) {
        expect(mailsAbout(account, 'Recoat window for layer 2 closing', 'Moving pool')).toEqual([]);
        expect(
          server.mail.messages.filter(
            (m) => m.to.includes(account.email) && m.text.includes('Moving pool') && m.subject.includes('Layer 2'),
          ),
        ).toEqual([]);
      }
      // Layer 3 became due at +560: once each.
      for (const account of [owner, builder]) {
        expect(mailsAbout(account, 'Layer 3 of 3 can go on', 'Moving pool').length).toBe(1);
      }
      await runDueReminders(server.ctx, sending);
      expect(mailsAbout(owner, 'Layer 3 of 3 can go on', 'Moving pool').length).toBe(1);
    },
    SWEEP_MS,
  );

  it(
    'should cancel every reminder and its waiting deliveries when the pour is deleted',
    async () => {
      const pour = await logPour('Deleted pool');
      await runDueReminders(server.ctx, sending);
      await client.delete(`/pours/${pour.id}`).expect(204);
      const rows = [...(await remindersOf(pour.id)).values()];
      expect(rows.length).toBeGreaterThan(0);
      expect(rows.every((row) => row.cancelledAt !== null)).toBeTrue();
      const deliveries = await server.ctx.db
        .select()
        .from(reminderDeliveries)
        .where(
          inArray(
            reminderDeliveries.reminderId,
            rows.map((row) => row.id),
          ),
        );
      expect(deliveries.length).toBeGreaterThan(0);
      expect(deliveries.every((delivery) => delivery.status === 'cancelled')).toBeTrue();
    },
    SWEEP_MS,
  );
});
