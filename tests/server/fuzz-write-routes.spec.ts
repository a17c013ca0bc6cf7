import { sql } from 'drizzle-orm';
import { browserKeys } from '../support/fake-push-service.js';
import fc from 'fast-check';
import { createServer, type Server } from 'node:http';
import request from 'supertest';
import { v7 } from 'uuid';
import { openApiDocument } from '../../server/openapi/openapi-document.js';
import { GOOD_PASSWORD, makeAccount, makeWorkshop, uniqueEmail, type TestAccount } from '../support/accounts.js';
import { anyJson, brokenJsonText, jsonText, nearValid, wrongTypesFor } from '../support/fuzz-bodies.js';
import { makeRecords } from '../support/records.js';
import { TEST_DATA_SHEET } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

const BODIES_IN_CI = 10_000;
const DEFAULT_SEED = 20_261_202;
const seed = Number(process.env['BENCHTIDE_FUZZ_SEED'] ?? DEFAULT_SEED);
const multiplier = Math.max(1, Number(process.env['BENCHTIDE_FUZZ_RUNS'] ?? 1));

type Method = 'post' | 'put' | 'patch' | 'delete';
interface WriteRoute {
  method: Method;
  path: string;
  schemaName: string;
  fields: string[];
}

/** Every write route whose body is JSON, read from the API document so a new one is fuzzed without a change here. */
function jsonWriteRoutes(): { fuzzed: WriteRoute[]; skipped: string[] } {
  const document = openApiDocument();
  const schemas = (document.components?.schemas ?? {}) as Record<string, { properties?: Record<string, unknown> }>;
  const fuzzed: WriteRoute[] = [];
  const skipped: string[] = [];
  for (const [path, item] of Object.entries(document.paths)) {
    for (const method of ['post', 'put', 'patch', 'delete'] as const) {
      const operation = item[method];
      if (!operation) continue;
      const content = (operation.requestBody as { content?: Record<string, { schema?: { $ref?: string } }> })?.content;
      const json = content?.['application/json'];
      if (!json) {
        skipped.push(`${method.toUpperCase()} ${path} (${content ? Object.keys(content).join(', ') : 'no body'})`);
        continue;
      }
      const schemaName = json.schema?.$ref?.split('/').at(-1) ?? '';
      fuzzed.push({ method, path, schemaName, fields: Object.keys(schemas[schemaName]?.properties ?? {}) });
    }
  }
  return { fuzzed, skipped };
}

interface Seeded {
  owner: TestAccount;
  workshopId: string;
  records: Awaited<ReturnType<typeof makeRecords>>;
}

/** A body each schema accepts, naming the seeded records and a fresh id; the fuzzer changes one field of it at a time. */
function validBody(
  schemaName: string,
  { owner, workshopId, records }: Seeded,
  fresh: string,
): Record<string, unknown> | undefined {
  const bodies: Record<string, Record<string, unknown>> = {
    SignUpRequest: { email: uniqueEmail('fuzz'), displayName: 'Fuzz', password: GOOD_PASSWORD },
    VerifyEmailRequest: { token: 'a'.repeat(43) },
    EmailOnlyRequest: { email: owner.email },
    SignInRequest: { email: owner.email, password: GOOD_PASSWORD },
    ResetPasswordRequest: { token: 'a'.repeat(43), newPassword: 'another long password' },
    UpdateAccountRequest: { displayName: 'Fuzz' },
    ChangePasswordRequest: { currentPassword: GOOD_PASSWORD, newPassword: 'another long password' },
    DeleteAccountRequest: { password: 'not the password at all' },
    WorkshopRequest: { name: 'Fuzzed workshop' },
    MemberRoleRequest: { role: 'builder' },
    InvitationRequest: { email: uniqueEmail('guest'), role: 'viewer' },
    NewBuild: { id: fresh, name: 'Quay', scaleRatio: 87, status: 'planning', notes: '' },
    BuildPatch: { name: 'Quay', scaleRatio: 76, status: 'building', notes: 'n', coverPhotoId: records.photoId },
    NewStep: {
      id: fresh,
      buildId: records.buildId,
      kind: 'other',
      title: 'Ballast',
      notes: '',
      happenedAt: '2026-11-02T10:00:00Z',
    },
    StepPatch: { title: 'Ballast', notes: 'n', happenedAt: '2026-11-02T10:00:00Z' },
    NewMaterial: {
      id: fresh,
      name: 'Resin',
      kind: 'two-part-epoxy',
      dataSheet: { ...TEST_DATA_SHEET, mixRatio: { ...TEST_DATA_SHEET.mixRatio } },
      safetySheet: '',
    },
    MaterialPatch: { name: 'Resin', safetySheet: '' },
    NewContainer: {
      id: fresh,
      materialId: records.materialId,
      part: 'A',
      sizeQty: 250,
      unit: 'g',
      priceMinor: 1200,
      currency: 'EUR',
      boughtOn: '2026-10-02',
    },
    ContainerPatch: { priceMinor: 1300, currency: 'EUR', boughtOn: '2026-10-03' },
    Waste: { id: fresh, quantity: 5, note: '' },
    Stocktake: { id: fresh, countedQty: 400 },
    NewPour: {
      id: fresh,
      buildId: records.buildId,
      materialId: records.materialId,
      shape: { kind: 'rectangle', lengthMm: 40, widthMm: 20 },
      depthMm: 2,
      displacedMl: 0,
      wastePercent: 0,
      roomTempC: 20,
      startAt: '2026-11-21T18:00:00Z',
      scaleResolutionG: 0.1,
      whenShort: 'refuse',
      note: '',
    },
    PourPatch: { note: 'Tail race', layerCount: 4 },
    NewPourLayer: {
      id: fresh,
      pourId: records.pourId,
      number: 3,
      pouredAt: '2026-11-21T06:00:00Z',
      roomTempC: 18,
      weighedAG: 10,
      weighedBG: 10,
      note: 'Tinted green',
    },
    PourLayerPatch: { pouredAt: '2026-11-21T01:00:00Z', roomTempC: 19, weighedAG: null, weighedBG: null, note: 'n' },
    PushRequest: {
      workshopId,
      mutations: [{ type: 'build.patch', mutationId: fresh, recordId: records.buildId, data: { name: 'Quay' } }],
    },
    PhotoPatch: { caption: 'Wet look' },
    ReminderPreferences: {
      kinds: ['demould'],
      channels: ['email'],
      quietHours: { from: '22:00', until: '07:00' },
      timeZone: 'Europe/Amsterdam',
    },
    PushSubscription: {
      endpoint: 'https://push.benchtide.test/sub/1',
      keys: browserKeys(),
      label: 'Phone',
    },
    PushUnsubscribe: { endpoint: 'https://push.benchtide.test/sub/1' },
  };
  return bodies[schemaName];
}

/** The path with the seeded records' ids (or a well-formed id of nothing) in place of its parameters. */
function concretePath(path: string, { owner, workshopId, records }: Seeded): string {
  const ids: Record<string, string> = { workshopId, userId: owner.id, token: 'a'.repeat(43), ...records };
  return path.replace(/\{(\w+)\}/g, (_, name: string) => ids[name] ?? v7());
}

/** What the workshop holds, cheaply: its change counter and how many rows each synced table has for it. */
async function fingerprint(server: TestServer, workshopId: string): Promise<string> {
  const count = (table: string) =>
    sql.raw(`(SELECT count(*) FROM ${table} WHERE workshop_id = '${workshopId}') AS ${table}`);
  const tables = [
    'builds',
    'build_steps',
    'materials',
    'containers',
    'ledger_entries',
    'pours',
    'pour_layers',
    'photos',
  ];
  const result = await server.ctx.db.execute(
    sql`SELECT change_counter, ${sql.join(tables.map(count), sql`, `)} FROM workshops WHERE id = ${workshopId}`,
  );
  return JSON.stringify(result.rows[0]);
}

const LEAKS: readonly [string, RegExp][] = [
  ['a stack frame', /\bat \S+ \(|\.ts:\d|\.js:\d|node_modules/],
  ['SQL', /\b(select|insert|update|delete)\b.*\b(from|into|set)\b/i],
  ['a database error', /syntax error|violates|\brelation\b|duplicate key|invalid byte sequence|invalid input syntax/i],
  ['a program word', /\bundefined\b|\[object Object\]|\bNaN\b|TypeError|RangeError/],
];

/** Why a refusal's body is not the one error shape in plain words, or undefined when it is. */
function refusalFault(body: unknown): string | undefined {
  const error = (body as { error?: unknown } | undefined)?.error as Record<string, unknown> | undefined;
  if (!error || typeof error !== 'object') return 'the body is not { error: { ... } }';
  const extra = Object.keys(error).filter((key) => !['code', 'message', 'fields', 'retryAfterMinutes'].includes(key));
  if (extra.length > 0) return `the error has unexpected keys ${extra.join(', ')}`;
  if (typeof error['code'] !== 'string' || !error['code']) return 'the error has no code';
  if (typeof error['message'] !== 'string' || !error['message']) return 'the error has no message';
  const fields = error['fields'];
  if (fields !== undefined && (typeof fields !== 'object' || fields === null || Array.isArray(fields))) {
    return 'fields is not an object';
  }
  const texts = [error['message'], ...Object.values((fields ?? {}) as Record<string, unknown>)];
  for (const text of texts) {
    if (typeof text !== 'string' || !text) return `a field message is not plain text: ${JSON.stringify(text)}`;
    const leak = LEAKS.find(([, pattern]) => pattern.test(text));
    if (leak) return `a message shows ${leak[0]}: ${text}`;
  }
  return undefined;
}

describe('fuzzing every write route', () => {
  const { fuzzed, skipped } = jsonWriteRoutes();
  // Rounded up, so the routes share at least the 10,000 bodies between them.
  const numRuns = Math.ceil(BODIES_IN_CI / fuzzed.length) * multiplier;
  let server: TestServer;
  let listening: Server;

  beforeAll(async () => {
    server = await testServer();
    listening = createServer(server.app).listen(0);
    process.stdout.write(
      `\n[fuzz] seed ${seed} (BENCHTIDE_FUZZ_SEED replays), ${numRuns} bodies on each of ${fuzzed.length} routes` +
        ` (${numRuns * fuzzed.length} in all);` +
        ` not fuzzed: ${skipped.join('; ')}\n`,
    );
  });

  afterAll(async () => {
    await new Promise((resolve) => listening.close(resolve));
  });

  it('should find write routes to fuzz in the API document', () => {
    expect(fuzzed.length).toBeGreaterThan(20);
    expect(fuzzed.map((route) => route.schemaName)).not.toContain('');
  });

  for (const route of fuzzed) {
    const name = `${route.method.toUpperCase()} ${route.path}`;
    it(`should refuse odd bodies to ${name} in plain words, changing nothing`, async () => {
      const seeded: Seeded = await (async () => {
        const owner = await makeAccount(server.ctx, 'Fuzz');
        const workshopId = (await makeWorkshop(server.ctx, owner)).id;
        return { owner, workshopId, records: await makeRecords(server.ctx, owner, workshopId) };
      })();
      const path = concretePath(route.path, seeded);
      const nearValidBodies = validBody(route.schemaName, seeded, v7())
        ? fc.uuid({ version: 7 }).chain((fresh) => nearValid(validBody(route.schemaName, seeded, fresh)!))
        : anyJson;
      const bodies = fc.oneof(
        { arbitrary: anyJson.map(jsonText), weight: 4 },
        { arbitrary: wrongTypesFor(route.fields).map(jsonText), weight: 2 },
        { arbitrary: nearValidBodies.map(jsonText), weight: 3 },
        { arbitrary: brokenJsonText, weight: 1 },
      );
      let before = await fingerprint(server, seeded.workshopId);
      // What the fuzzer got accepted (push subscriptions with made-up keys) must not reach other specs' reminder runs.
      const forget = () => server.ctx.db.execute(sql`DELETE FROM users WHERE id = ${seeded.owner.id}`);

      await fc
        .assert(
          fc.asyncProperty(bodies, async (text) => {
            const client = request(listening);
            const response = await client[route.method](path)
              .set('Cookie', seeded.owner.cookie)
              .set('Content-Type', 'application/json')
              .send(text);
            const after = await fingerprint(server, seeded.workshopId);
            if (response.status >= 500) {
              throw new Error(`${name} answered ${response.status}: ${JSON.stringify(response.body)}`);
            }
            if (response.status >= 400) {
              const fault = refusalFault(response.body);
              if (fault) throw new Error(`${name} refused with ${response.status}, but ${fault}`);
              if (after !== before)
                throw new Error(`${name} refused with ${response.status} yet changed ${before} to ${after}`);
            }
            before = after;
          }),
          { numRuns, seed },
        )
        .finally(forget);
    }, 600_000);
  }
});
