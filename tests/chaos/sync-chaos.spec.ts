import { spawn } from 'node:child_process';
import { and, eq, inArray, isNull, ne } from 'drizzle-orm';
import {
  builds,
  buildSteps as steps,
  containerStock,
  ledgerEntries,
  pourLayers,
  pours,
  pushedMutations,
} from '../../server/db/schema/index.js';
import { startAppServer, type RunningApp } from '../e2e/support/app-server.js';
import { addMember, makeAccount, makeWorkshop } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { DroppingProxy } from './support/dropping-proxy.js';
import { seededRandom } from './support/seeded-random.js';
import { LAYER_2_WEIGHED_G, SimulatedDevice, type ExpectedRecords } from './support/simulated-device.js';

const SEED = Number(process.env['BENCHTIDE_CHAOS_SEED'] ?? 20261202);
const DEVICES = 3;
const WRITES_PER_DEVICE = 300;
const DROP_RATE = 0.3;
const BATCH = 25;
const CONTAINER_SIZE_G = 100_000;
/** The whole run must settle within this; a sync that never converges fails here rather than hanging. */
const DEADLINE_MS = 180_000;

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
const thousandths = (grams: number) => Math.round(grams * 1000);

function restartPostgres(): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['tools/postgres.mjs', 'restart'], { stdio: ['ignore', 'ignore', 'pipe'] });
    let errors = '';
    child.stderr.on('data', (chunk: Buffer) => (errors += chunk.toString()));
    child.once('exit', (code) => (code === 0 ? resolve() : reject(new Error(`PostgreSQL restart failed: ${errors}`))));
  });
}

function union<K extends keyof ExpectedRecords>(devices: readonly SimulatedDevice[], key: K): ExpectedRecords[K] {
  const all = new Map();
  for (const device of devices) for (const [id, record] of device.expected[key]) all.set(id, record);
  return all as ExpectedRecords[K];
}

// Seed printed so a failing run can be replayed: BENCHTIDE_CHAOS_SEED=<seed> npm test.
describe(`sync under faults (seed ${SEED})`, () => {
  let server: TestServer;
  let api1: RunningApp;
  let api2: RunningApp | undefined;
  let proxy: DroppingProxy;
  let workshopId: string;
  let containerIds: string[];
  let referencePourDraw: Map<string, number>;
  /** A pour whose layer 2 was recorded draws layer 1 as planned and layer 2 as weighed. */
  let layeredPourDraw: Map<string, number>;

  beforeAll(async () => {
    server = await testServer();
    const owner = await makeAccount(server.ctx, 'Odile');
    const builders = [await makeAccount(server.ctx, 'Bram'), await makeAccount(server.ctx, 'Kasia')];
    workshopId = (await makeWorkshop(server.ctx, owner, 'Harbour club')).id;
    for (const builder of builders) await addMember(server.ctx, workshopId, builder, 'builder');
    const client = api(server, owner, workshopId);
    const materialId = await addMaterial(client, { name: 'Clear casting resin' });
    containerIds = [
      await addContainer(client, materialId, { part: 'A', sizeQty: CONTAINER_SIZE_G }),
      await addContainer(client, materialId, { part: 'B', sizeQty: CONTAINER_SIZE_G }),
    ];
    // Every pour in the run has this one's shape and material, so each draws exactly what it drew.
    const referenceBuild = await addBuild(client, { name: 'Reference harbour' });
    const reference = pourBody(referenceBuild, materialId, { layerCount: 2 });
    await client.post('/pours', reference).expect(201);
    const [firstLayer] = await server.ctx.db.select().from(pourLayers).where(eq(pourLayers.pourId, reference.id));
    layeredPourDraw = new Map([
      [containerIds[0]!, thousandths(firstLayer!.partAG + LAYER_2_WEIGHED_G)],
      [containerIds[1]!, thousandths(firstLayer!.partBG + LAYER_2_WEIGHED_G)],
    ]);
    const drawn = await server.ctx.db
      .select()
      .from(ledgerEntries)
      .where(and(eq(ledgerEntries.pourId, reference.id), isNull(ledgerEntries.deletedAt)));
    referencePourDraw = new Map(drawn.map((entry) => [entry.containerId, thousandths(-entry.quantity)]));
    expect([...referencePourDraw.keys()].sort()).toEqual([...containerIds].sort());

    api1 = await startAppServer({ LOG_LEVEL: 'silent' });
    proxy = new DroppingProxy(api1.port, DROP_RATE, seededRandom(SEED));
    const origin = await proxy.listen();
    devices = [owner, ...builders].map(
      (account, i) =>
        new SimulatedDevice(
          {
            name: account.displayName,
            cookie: account.cookie,
            workshopId,
            materialId,
            containerIds,
            random: seededRandom(SEED + i + 1),
          },
          () => origin,
        ),
    );
  }, 60_000);

  let devices: SimulatedDevice[];

  afterAll(async () => {
    await proxy?.close();
    await api1?.stop();
    await api2?.stop();
  });

  it(
    `should hold exactly the union of ${DEVICES} devices' ${WRITES_PER_DEVICE} changes each after dropped answers, an API crash and a database restart`,
    async () => {
      const started = Date.now();
      const pastDeadline = () => Date.now() - started > DEADLINE_MS;
      const written = () => devices.reduce((sum, device) => sum + device.writtenCount, 0);
      const total = DEVICES * WRITES_PER_DEVICE;
      const events: string[] = [];

      async function runDevice(device: SimulatedDevice, random: () => number): Promise<void> {
        let backoff = 20;
        while ((device.writtenCount < WRITES_PER_DEVICE || device.outbox.length > 0) && !pastDeadline()) {
          for (let i = 1 + Math.floor(random() * 4); i > 0 && device.writtenCount < WRITES_PER_DEVICE; i -= 1) {
            device.write();
          }
          try {
            await device.sync(BATCH);
            backoff = 20;
          } catch {
            backoff = Math.min(backoff * 2, 1000);
            await sleep(backoff);
          }
        }
      }

      // The faults, each while a push is on its way to the server.
      async function faults(): Promise<void> {
        const whilePushing = async () => {
          while (proxy.pushesInFlight === 0 && !pastDeadline()) await sleep(2);
        };
        while (written() < total / 3 && !pastDeadline()) await sleep(10);
        await whilePushing();
        events.push(`API crashed with ${proxy.pushesInFlight} push(es) in flight after ${written()} writes`);
        await api1.crash();
        api2 = await startAppServer({ LOG_LEVEL: 'silent' });
        proxy.targetPort = api2.port;
        while (written() < (2 * total) / 3 && !pastDeadline()) await sleep(10);
        await whilePushing();
        events.push(`PostgreSQL restarted with ${proxy.pushesInFlight} push(es) in flight after ${written()} writes`);
        await restartPostgres();
      }

      const progress = setInterval(() => {
        const outboxes = devices.map((d) => d.outbox.length).join('/');
        const seconds = ((Date.now() - started) / 1000).toFixed(0);
        console.log(`  chaos sync, ${seconds} s: ${written()} of ${total} written, outboxes ${outboxes}`);
      }, 10_000);
      try {
        await Promise.all([faults(), ...devices.map((device, i) => runDevice(device, seededRandom(SEED * 7 + i)))]);
      } finally {
        clearInterval(progress);
      }
      // One last round so every device has pulled what the others pushed last.
      for (const device of devices) {
        while (!pastDeadline()) {
          try {
            await device.sync(BATCH);
            break;
          } catch {
            await sleep(50);
          }
        }
      }
      const seconds = ((Date.now() - started) / 1000).toFixed(1);
      console.log(
        `  chaos sync: ${events.join('; ')}; ${proxy.pushesDropped} of ${proxy.pushesAnswered} push answers dropped; ` +
          `${devices.map((d) => d.failedRequests).join('/')} failed requests per device; ${seconds} s`,
      );

      expect(pastDeadline())
        .withContext(`not settled within ${DEADLINE_MS / 1000} s`)
        .toBeFalse();
      expect(events.length).toBe(2);
      expect(proxy.pushesDropped).toBeGreaterThan(proxy.pushesAnswered * 0.15);
      for (const device of devices) {
        expect(device.writtenCount).toBe(WRITES_PER_DEVICE);
        expect(device.outbox).withContext(`${device.sentMutationIds.length} sent`).toEqual([]);
        expect(device.rejected).toEqual([]);
      }

      const db = server.ctx.db;
      // Every change applied exactly once, and recorded as applied.
      const sent = devices.flatMap((device) => device.sentMutationIds);
      const recorded = await db.select().from(pushedMutations).where(eq(pushedMutations.workshopId, workshopId));
      expect(recorded.length).toBe(sent.length);
      expect(new Set(recorded.map((row) => row.mutationId))).toEqual(new Set(sent));
      expect(recorded.filter((row) => row.result.status !== 'applied')).toEqual([]);

      // The server holds exactly the union: nothing lost, nothing doubled, every device's last word.
      const expectedBuilds = union(devices, 'builds');
      const serverBuilds = await db
        .select()
        .from(builds)
        .where(and(eq(builds.workshopId, workshopId), ne(builds.name, 'Reference harbour')));
      expect(new Map(serverBuilds.map((b) => [b.id, { name: b.name, notes: b.notes }]))).toEqual(expectedBuilds);

      const expectedSteps = union(devices, 'steps');
      const serverSteps = await db.select().from(steps).where(eq(steps.workshopId, workshopId));
      expect(
        new Map(serverSteps.map((s) => [s.id, { buildId: s.buildId, title: s.title, deleted: s.deletedAt !== null }])),
      ).toEqual(expectedSteps);

      const expectedPours = union(devices, 'pours');
      const serverPours = await db
        .select()
        .from(pours)
        .where(and(eq(pours.workshopId, workshopId), inArray(pours.buildId, [...expectedBuilds.keys()])));
      // Layer 2 is held, once, for each pour a device recorded it on, and goes with a deleted pour.
      const secondLayers = await db
        .select()
        .from(pourLayers)
        .where(and(eq(pourLayers.workshopId, workshopId), eq(pourLayers.number, 2)));
      const layered = new Set(secondLayers.map((layer) => layer.pourId));
      expect(secondLayers.length).toBe(layered.size);
      expect(
        new Map(
          serverPours.map((p) => [
            p.id,
            { buildId: p.buildId, deleted: p.deletedAt !== null, layered: layered.has(p.id) },
          ]),
        ),
      ).toEqual(expectedPours);
      for (const layer of secondLayers) {
        expect(layer.deletedAt !== null).toBe(expectedPours.get(layer.pourId)!.deleted);
      }

      const expectedWastes = union(devices, 'wastes');
      const serverWastes = await db
        .select()
        .from(ledgerEntries)
        .where(and(eq(ledgerEntries.workshopId, workshopId), eq(ledgerEntries.kind, 'waste')));
      expect(
        new Map(serverWastes.map((w) => [w.id, { containerId: w.containerId, thousandths: -thousandths(w.quantity) }])),
      ).toEqual(expectedWastes);

      // Stock sums exact: what each container had, less every live pour's draw and every waste, to the milligram.
      const live = [...expectedPours.values()].filter((pour) => !pour.deleted);
      const livePours = 1 + live.filter((pour) => !pour.layered).length;
      const liveLayered = live.filter((pour) => pour.layered).length;
      expect(liveLayered).withContext('some live pours have layer 2').toBeGreaterThan(0);
      const stock = await db.select().from(containerStock).where(inArray(containerStock.containerId, containerIds));
      for (const containerId of containerIds) {
        const wasted = [...expectedWastes.values()]
          .filter((waste) => waste.containerId === containerId)
          .reduce((sum, waste) => sum + waste.thousandths, 0);
        const expected =
          thousandths(CONTAINER_SIZE_G) -
          livePours * referencePourDraw.get(containerId)! -
          liveLayered * layeredPourDraw.get(containerId)! -
          wasted;
        const held = stock.find((row) => row.containerId === containerId);
        expect(thousandths(Number(held?.remaining)))
          .withContext(`container ${containerId}`)
          .toBe(expected);
      }

      // Every device's copy is the server's.
      const serverCopy = new Map<string, boolean>([
        ...serverBuilds.map((b) => [`build:${b.id}`, b.deletedAt !== null] as const),
        ...serverSteps.map((s) => [`step:${s.id}`, s.deletedAt !== null] as const),
        ...serverPours.map((p) => [`pour:${p.id}`, p.deletedAt !== null] as const),
      ]);
      for (const device of devices) {
        const copied = new Map(
          [...device.copy]
            .filter(([key]) => serverCopy.has(key))
            .map(([key, record]) => [key, record['deletedAt'] !== null] as const),
        );
        expect(copied).withContext(device.sentMutationIds[0]!).toEqual(serverCopy);
      }
    },
    DEADLINE_MS + 60_000,
  );
});
