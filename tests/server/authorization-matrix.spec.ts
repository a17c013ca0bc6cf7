import request from 'supertest';
import { browserKeys } from '../support/fake-push-service.js';
import type { Role } from '../../shared/account-schemas.js';
import { invite } from '../../server/workshops/invitation-service.js';
import { issueToken } from '../../server/auth/tokens.js';
import {
  addMember,
  GOOD_PASSWORD,
  makeAccount,
  makeWorkshop,
  uniqueEmail,
  type TestAccount,
} from '../support/accounts.js';
import { listRoutes } from '../support/routes.js';
import { ACCESS_EXTENSION, openApiDocument, type OperationAccess } from '../../server/openapi/openapi-document.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { linkIn } from '../../server/mail/mail-sink.js';
import { v7 } from 'uuid';
import { pourBody, TEST_DATA_SHEET } from '../support/shelf.js';
import { makeRecords } from '../support/records.js';
import { benchJpeg } from '../support/photos.js';

type Caller = 'anonymous' | Role | 'outsider';
const CALLERS: readonly Caller[] = ['anonymous', 'viewer', 'builder', 'owner', 'outsider'];

/** A fresh workshop for every cell: an owner, a builder, a viewer, a spare member, an open invitation. */
interface Fixture {
  workshopId: string;
  spare: TestAccount;
  invitationId: string;
  buildId: string;
  stepId: string;
  materialId: string;
  containerId: string;
  pourId: string;
  layerId: string;
  photoId: string;
  /** An invitation sent to the caller (or to nobody in particular for an anonymous caller). */
  invitationTokenForCaller: string;
  caller: TestAccount | null;
}

type Expected = Record<Caller, number>;
interface Row {
  route: string;
  path: (f: Fixture) => string;
  body?: (f: Fixture) => object;
  /** A multipart form instead of a JSON body: text fields and the photo file. */
  form?: (f: Fixture) => { fields: Record<string, string>; photo: Buffer };
  expected: Expected;
}

const everyone = (status: number): Expected => ({
  anonymous: status,
  viewer: status,
  builder: status,
  owner: status,
  outsider: status,
});
const signedInOnly = (status: number): Expected => ({ ...everyone(status), anonymous: 401 });
const ownerOnly = (status: number): Expected => ({
  anonymous: 401,
  viewer: 403,
  builder: 403,
  owner: status,
  outsider: 404,
});
const membersOnly = (status: number): Expected => ({
  anonymous: 401,
  viewer: status,
  builder: status,
  owner: status,
  outsider: 404,
});
const writers = (status: number): Expected => ({
  anonymous: 401,
  viewer: 403,
  builder: status,
  owner: status,
  outsider: 404,
});
const bogusToken = `${'0'.repeat(32)}_${'A'.repeat(43)}`;
/** Made once, before the rows run. */
let matrixPhoto: Buffer;
const w = (f: Fixture) => `/api/workshops/${f.workshopId}`;

const MATRIX: readonly Row[] = [
  { route: 'GET /api/health', path: () => '/api/health', expected: everyone(200) },
  { route: 'GET /api/openapi.json', path: () => '/api/openapi.json', expected: everyone(200) },
  { route: 'GET /api/reference', path: () => '/api/reference', expected: everyone(200) },
  {
    route: 'POST /api/auth/sign-up',
    path: () => '/api/auth/sign-up',
    body: () => ({ email: uniqueEmail('new'), displayName: 'New', password: GOOD_PASSWORD }),
    expected: everyone(202),
  },
  {
    route: 'POST /api/auth/verify',
    path: () => '/api/auth/verify',
    body: () => ({ token: bogusToken }),
    expected: everyone(400),
  },
  {
    route: 'POST /api/auth/verify/resend',
    path: () => '/api/auth/verify/resend',
    body: () => ({ email: uniqueEmail('x') }),
    expected: everyone(202),
  },
  {
    route: 'POST /api/auth/sign-in',
    path: () => '/api/auth/sign-in',
    body: () => ({ email: uniqueEmail('nobody'), password: GOOD_PASSWORD }),
    expected: everyone(401),
  },
  { route: 'POST /api/auth/sign-out', path: () => '/api/auth/sign-out', expected: everyone(204) },
  { route: 'POST /api/auth/sign-out-others', path: () => '/api/auth/sign-out-others', expected: signedInOnly(204) },
  {
    route: 'POST /api/auth/forgot',
    path: () => '/api/auth/forgot',
    body: () => ({ email: uniqueEmail('y') }),
    expected: everyone(202),
  },
  {
    route: 'POST /api/auth/reset',
    path: () => '/api/auth/reset',
    body: () => ({ token: bogusToken, newPassword: 'salt marsh at low tide' }),
    expected: everyone(400),
  },
  { route: 'GET /api/account', path: () => '/api/account', expected: signedInOnly(200) },
  { route: 'GET /api/reminders/push-key', path: () => '/api/reminders/push-key', expected: everyone(200) },
  { route: 'GET /api/account/reminders', path: () => '/api/account/reminders', expected: signedInOnly(200) },
  {
    route: 'PUT /api/account/reminders',
    path: () => '/api/account/reminders',
    body: () => ({ kinds: ['demould'], channels: ['email'], quietHours: null, timeZone: 'UTC' }),
    expected: signedInOnly(200),
  },
  {
    route: 'POST /api/account/push-subscriptions',
    path: () => '/api/account/push-subscriptions',
    body: () => ({
      endpoint: `https://push.invalid/${v7()}`,
      keys: browserKeys(),
      label: 'Phone',
    }),
    expected: signedInOnly(204),
  },
  {
    route: 'DELETE /api/account/push-subscriptions',
    path: () => '/api/account/push-subscriptions',
    body: () => ({ endpoint: 'https://push.invalid/gone' }),
    expected: signedInOnly(204),
  },
  {
    route: 'PATCH /api/account',
    path: () => '/api/account',
    body: () => ({ displayName: 'Renamed' }),
    expected: signedInOnly(200),
  },
  {
    route: 'POST /api/account/password',
    path: () => '/api/account/password',
    body: () => ({ currentPassword: GOOD_PASSWORD, newPassword: 'salt marsh at low tide' }),
    expected: signedInOnly(204),
  },
  {
    route: 'DELETE /api/account',
    path: () => '/api/account',
    body: () => ({ password: GOOD_PASSWORD }),
    // The owner is the only owner of a workshop with others in it; the outsider owns one alone.
    expected: { anonymous: 401, viewer: 204, builder: 204, owner: 409, outsider: 204 },
  },
  { route: 'GET /api/workshops', path: () => '/api/workshops', expected: signedInOnly(200) },
  {
    route: 'POST /api/workshops',
    path: () => '/api/workshops',
    body: () => ({ name: 'Another' }),
    expected: signedInOnly(201),
  },
  {
    route: 'PATCH /api/workshops/:workshopId',
    path: (f) => `/api/workshops/${f.workshopId}`,
    body: () => ({ name: 'Renamed workshop' }),
    expected: ownerOnly(200),
  },
  {
    route: 'GET /api/workshops/:workshopId/members',
    path: (f) => `/api/workshops/${f.workshopId}/members`,
    expected: membersOnly(200),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/members/:userId',
    path: (f) => `/api/workshops/${f.workshopId}/members/${f.spare.id}`,
    body: () => ({ role: 'builder' }),
    expected: ownerOnly(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/members/:userId',
    path: (f) => `/api/workshops/${f.workshopId}/members/${f.spare.id}`,
    expected: ownerOnly(204),
  },
  {
    route: 'GET /api/workshops/:workshopId/invitations',
    path: (f) => `/api/workshops/${f.workshopId}/invitations`,
    expected: ownerOnly(200),
  },
  {
    route: 'POST /api/workshops/:workshopId/invitations',
    path: (f) => `/api/workshops/${f.workshopId}/invitations`,
    body: () => ({ email: uniqueEmail('guest'), role: 'viewer' }),
    expected: ownerOnly(201),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/invitations/:invitationId',
    path: (f) => `/api/workshops/${f.workshopId}/invitations/${f.invitationId}`,
    expected: ownerOnly(204),
  },
  { route: 'GET /api/workshops/:workshopId/builds', path: (f) => `${w(f)}/builds`, expected: membersOnly(200) },
  {
    route: 'POST /api/workshops/:workshopId/builds',
    path: (f) => `${w(f)}/builds`,
    body: () => ({ id: v7(), name: 'Ford', scaleRatio: 35, status: 'planning' }),
    expected: writers(201),
  },
  {
    route: 'GET /api/workshops/:workshopId/builds/:buildId',
    path: (f) => `${w(f)}/builds/${f.buildId}`,
    expected: membersOnly(200),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/builds/:buildId',
    path: (f) => `${w(f)}/builds/${f.buildId}`,
    body: () => ({ status: 'finished' }),
    expected: writers(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/builds/:buildId',
    path: (f) => `${w(f)}/builds/${f.buildId}`,
    expected: writers(204),
  },
  {
    route: 'GET /api/workshops/:workshopId/builds/:buildId/steps',
    path: (f) => `${w(f)}/builds/${f.buildId}/steps`,
    expected: membersOnly(200),
  },
  {
    route: 'POST /api/workshops/:workshopId/steps',
    path: (f) => `${w(f)}/steps`,
    body: (f) => ({
      id: v7(),
      buildId: f.buildId,
      kind: 'painting',
      title: 'Riverbed',
      happenedAt: '2026-11-02T10:00:00Z',
    }),
    expected: writers(201),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/steps/:stepId',
    path: (f) => `${w(f)}/steps/${f.stepId}`,
    body: () => ({ title: 'Riverbed, second coat' }),
    expected: writers(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/steps/:stepId',
    path: (f) => `${w(f)}/steps/${f.stepId}`,
    expected: writers(204),
  },
  { route: 'GET /api/workshops/:workshopId/shelf', path: (f) => `${w(f)}/shelf`, expected: membersOnly(200) },
  { route: 'GET /api/workshops/:workshopId/materials', path: (f) => `${w(f)}/materials`, expected: membersOnly(200) },
  {
    route: 'POST /api/workshops/:workshopId/materials',
    path: (f) => `${w(f)}/materials`,
    body: () => ({ id: v7(), name: 'Gel', kind: 'water-gel', dataSheet: TEST_DATA_SHEET }),
    expected: writers(201),
  },
  {
    route: 'GET /api/workshops/:workshopId/materials/:materialId',
    path: (f) => `${w(f)}/materials/${f.materialId}`,
    expected: membersOnly(200),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/materials/:materialId',
    path: (f) => `${w(f)}/materials/${f.materialId}`,
    body: () => ({ name: 'Renamed resin' }),
    expected: writers(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/materials/:materialId',
    path: (f) => `${w(f)}/materials/${f.materialId}`,
    expected: writers(204),
  },
  {
    route: 'POST /api/workshops/:workshopId/containers',
    path: (f) => `${w(f)}/containers`,
    body: (f) => ({
      id: v7(),
      materialId: f.materialId,
      part: 'B',
      sizeQty: 250,
      unit: 'g',
      priceMinor: 900,
      currency: 'EUR',
      boughtOn: '2026-10-01',
    }),
    expected: writers(201),
  },
  {
    route: 'GET /api/workshops/:workshopId/containers/:containerId',
    path: (f) => `${w(f)}/containers/${f.containerId}`,
    expected: membersOnly(200),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/containers/:containerId',
    path: (f) => `${w(f)}/containers/${f.containerId}`,
    body: () => ({ lowStockQty: 50 }),
    expected: writers(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/containers/:containerId',
    path: (f) => `${w(f)}/containers/${f.containerId}`,
    expected: writers(204),
  },
  {
    route: 'POST /api/workshops/:workshopId/containers/:containerId/waste',
    path: (f) => `${w(f)}/containers/${f.containerId}/waste`,
    body: () => ({ id: v7(), quantity: 2 }),
    expected: writers(201),
  },
  {
    route: 'POST /api/workshops/:workshopId/containers/:containerId/stocktake',
    path: (f) => `${w(f)}/containers/${f.containerId}/stocktake`,
    body: () => ({ id: v7(), countedQty: 300 }),
    expected: writers(201),
  },
  {
    route: 'GET /api/workshops/:workshopId/builds/:buildId/pours',
    path: (f) => `${w(f)}/builds/${f.buildId}/pours`,
    expected: membersOnly(200),
  },
  {
    route: 'POST /api/workshops/:workshopId/pours',
    path: (f) => `${w(f)}/pours`,
    body: (f) => ({ ...pourBody(f.buildId, f.materialId), whenShort: 'record-shortfall' }),
    expected: writers(201),
  },
  {
    route: 'GET /api/workshops/:workshopId/pours/:pourId',
    path: (f) => `${w(f)}/pours/${f.pourId}`,
    expected: membersOnly(200),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/pours/:pourId',
    path: (f) => `${w(f)}/pours/${f.pourId}`,
    body: () => ({ note: 'Tail race' }),
    expected: writers(200),
  },
  {
    route: 'GET /api/workshops/:workshopId/pours/:pourId/layers',
    path: (f) => `${w(f)}/pours/${f.pourId}/layers`,
    expected: membersOnly(200),
  },
  {
    route: 'POST /api/workshops/:workshopId/layers',
    path: (f) => `${w(f)}/layers`,
    body: (f) => ({ id: v7(), pourId: f.pourId, number: 3, pouredAt: '2026-11-21T06:00:00Z', roomTempC: 20 }),
    expected: writers(201),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/layers/:layerId',
    path: (f) => `${w(f)}/layers/${f.layerId}`,
    body: () => ({ note: 'Tinted green' }),
    expected: writers(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/layers/:layerId',
    path: (f) => `${w(f)}/layers/${f.layerId}`,
    expected: writers(204),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/pours/:pourId',
    path: (f) => `${w(f)}/pours/${f.pourId}`,
    expected: writers(204),
  },
  {
    route: 'PUT /api/workshops/:workshopId/photos/:photoId',
    path: (f) => `${w(f)}/photos/${v7()}`,
    form: (f) => ({ fields: { buildId: f.buildId, stepId: f.stepId, caption: 'Riverbed' }, photo: matrixPhoto }),
    expected: writers(201),
  },
  {
    route: 'GET /api/workshops/:workshopId/photos/:photoId/:size',
    path: (f) => `${w(f)}/photos/${f.photoId}/thumb`,
    expected: membersOnly(200),
  },
  {
    route: 'GET /api/workshops/:workshopId/builds/:buildId/photos',
    path: (f) => `${w(f)}/builds/${f.buildId}/photos`,
    expected: membersOnly(200),
  },
  {
    route: 'PATCH /api/workshops/:workshopId/photos/:photoId',
    path: (f) => `${w(f)}/photos/${f.photoId}`,
    body: () => ({ caption: 'After the second layer' }),
    expected: writers(200),
  },
  {
    route: 'DELETE /api/workshops/:workshopId/photos/:photoId',
    path: (f) => `${w(f)}/photos/${f.photoId}`,
    expected: writers(204),
  },
  { route: 'GET /api/workshops/:workshopId/costs', path: (f) => `${w(f)}/costs`, expected: membersOnly(200) },
  { route: 'GET /api/workshops/:workshopId/costs.csv', path: (f) => `${w(f)}/costs.csv`, expected: membersOnly(200) },
  { route: 'GET /api/workshops/:workshopId/export.json', path: (f) => `${w(f)}/export.json`, expected: ownerOnly(200) },
  {
    route: 'GET /api/workshops/:workshopId/export/:table.csv',
    path: (f) => `${w(f)}/export/pours.csv`,
    expected: ownerOnly(200),
  },
  {
    route: 'POST /api/sync/push',
    path: () => '/api/sync/push',
    body: (f) => ({
      workshopId: f.workshopId,
      mutations: [{ type: 'build.delete', mutationId: v7(), recordId: f.buildId }],
    }),
    // Members get answers (a viewer's write answered as rejected); strangers get nothing.
    expected: membersOnly(200),
  },
  {
    route: 'GET /api/sync/pull',
    path: (f) => `/api/sync/pull?workshopId=${f.workshopId}&after=0`,
    // A stranger is told to start over: nothing of the workshop is in the answer.
    expected: signedInOnly(200),
  },
  {
    route: 'GET /api/invitations/:token',
    path: (f) => `/api/invitations/${f.invitationTokenForCaller}`,
    expected: everyone(200),
  },
  {
    route: 'POST /api/invitations/:token/accept',
    path: (f) => `/api/invitations/${f.invitationTokenForCaller}/accept`,
    expected: signedInOnly(200),
  },
];

const HTTP_METHODS = new Set(['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace']);

/** Each operation of the API document as "METHOD /path" in Express's form, with who it says may call. */
function documentedRoutes(): Map<string, OperationAccess> {
  const routes = new Map<string, OperationAccess>();
  for (const [path, item] of Object.entries(openApiDocument().paths)) {
    for (const [method, operation] of Object.entries(item as Record<string, Record<string, unknown>>)) {
      if (!HTTP_METHODS.has(method)) continue;
      const route = `${method.toUpperCase()} ${path.replace(/\{(\w+)\}/g, ':$1')}`;
      routes.set(route, operation[ACCESS_EXTENSION] as OperationAccess);
    }
  }
  return routes;
}

describe('the authorisation matrix', () => {
  let server: TestServer;

  beforeAll(async () => {
    server = await testServer();
    matrixPhoto = await benchJpeg({ width: 64, height: 48 });
  });

  async function fixture(caller: Caller, needsInvitation: boolean): Promise<Fixture> {
    const ctx = server.ctx;
    const owner = await makeAccount(ctx, 'owner');
    const workshop = await makeWorkshop(ctx, owner);
    const spare = await makeAccount(ctx, 'spare');
    await addMember(ctx, workshop.id, spare, 'viewer');
    const members: Partial<Record<Caller, TestAccount>> = { owner };
    for (const role of ['builder', 'viewer'] as const) {
      members[role] = await makeAccount(ctx, role);
      await addMember(ctx, workshop.id, members[role], role);
    }
    if (caller === 'outsider') {
      members.outsider = await makeAccount(ctx, 'outsider');
      await makeWorkshop(ctx, members.outsider, 'Elsewhere');
    }
    const callerAccount = members[caller] ?? null;
    const invitation = await invite(ctx, owner, workshop.id, uniqueEmail('invited'), 'viewer');
    let invitationTokenForCaller = bogusToken;
    if (needsInvitation) {
      const forCaller = await invite(ctx, owner, workshop.id, callerAccount?.email ?? uniqueEmail('anyone'), 'builder');
      invitationTokenForCaller = linkIn(await server.mail.waitFor(forCaller.email)).split('/invitations/')[1]!;
    }
    const records = await makeRecords(ctx, owner, workshop.id);
    return {
      workshopId: workshop.id,
      spare,
      invitationId: invitation.id,
      invitationTokenForCaller,
      caller: callerAccount,
      ...records,
    };
  }

  it('should cover every API route the app answers', async () => {
    const apiRoutes = listRoutes(server.app).filter((route) => route.includes(' /api/'));
    expect(apiRoutes.filter((route) => !MATRIX.some((row) => row.route === route))).toEqual([]);
    expect(MATRIX.filter((row) => !apiRoutes.includes(row.route)).map((row) => row.route)).toEqual([]);
  });

  it('should cover every route the API document describes, and no route it leaves out', () => {
    const documented = [...documentedRoutes().keys()];

    expect(documented.filter((route) => !MATRIX.some((row) => row.route === route))).toEqual([]);
    expect(MATRIX.filter((row) => !documented.includes(row.route)).map((row) => row.route)).toEqual([]);
  });

  it('should expect of each route what the API document tells callers about it', () => {
    const documented = documentedRoutes();
    const disagreements: string[] = [];
    for (const row of MATRIX) {
      const access = documented.get(row.route);
      if (!access) continue;
      if (access.signInNeeded && row.expected.anonymous !== 401) disagreements.push(`${row.route}: anonymous`);
      if (!access.roles) continue;
      for (const role of ['viewer', 'builder', 'owner'] as const) {
        if (access.roles.includes(role) === (row.expected[role] === 403)) disagreements.push(`${row.route}: ${role}`);
      }
      if (row.expected.outsider !== 404) disagreements.push(`${row.route}: outsider`);
    }

    expect(disagreements).toEqual([]);
  });

  for (const row of MATRIX) {
    it(`should answer ${row.route} with ${CALLERS.map((caller) => `${caller} ${row.expected[caller]}`).join(', ')}`, async () => {
      const actual: Partial<Expected> = {};
      for (const caller of CALLERS) {
        // Each cell gets an hour of its own, so rate limits never decide an answer here.
        server.clock.advanceMinutes(61);
        const f = await fixture(caller, row.route.includes(':token'));
        const [method, path] = [row.route.split(' ')[0]!.toLowerCase() as 'get', row.path(f)];
        let call = request(server.app)[method](path);
        if (f.caller) call = call.set('Cookie', f.caller.cookie);
        if (row.form) {
          const { fields, photo } = row.form(f);
          for (const [name, value] of Object.entries(fields)) call = call.field(name, value);
          call = call.attach('photo', photo, { filename: 'bench.jpg', contentType: 'image/jpeg' });
        }
        const response = await (row.body ? call.send(row.body(f)) : call);
        actual[caller] = response.status;
      }
      expect(actual).toEqual(row.expected);
    }, 30_000);
  }

  it('should never accept a token it did not issue for an invitation', async () => {
    const forged = issueToken('00000000-0000-0000-0000-000000000000').token;
    await request(server.app).get(`/api/invitations/${forged}`).expect(404);
  });
});
