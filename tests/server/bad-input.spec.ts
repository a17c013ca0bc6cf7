import { sql } from 'drizzle-orm';
import request from 'supertest';
import { makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { testServer, type TestServer } from '../support/test-app.js';

/** Every table a write could touch, counted before and after a refused request. */
async function rowCounts(server: TestServer): Promise<string> {
  const result = await server.ctx.db.execute(sql`
    SELECT (SELECT count(*) FROM users) AS users, (SELECT count(*) FROM workshops) AS workshops,
           (SELECT count(*) FROM memberships) AS memberships, (SELECT count(*) FROM invitations) AS invitations,
           (SELECT count(*) FROM email_tokens) AS tokens, (SELECT count(*) FROM sessions) AS sessions,
           (SELECT max(updated_at) FROM users) AS users_changed, (SELECT max(updated_at) FROM workshops) AS workshops_changed`);
  return JSON.stringify(result.rows[0]);
}

describe('bad input on every form', () => {
  let server: TestServer;
  let owner: TestAccount;
  let workshopId: string;

  beforeAll(async () => {
    server = await testServer();
    owner = await makeAccount(server.ctx, 'Wil');
    workshopId = (await makeWorkshop(server.ctx, owner)).id;
  });

  const cases: readonly { route: string; body: object; field: string; message: string }[] = [
    {
      route: 'POST /api/auth/sign-up',
      body: { email: 'not-an-address', displayName: 'X', password: 'long enough pass' },
      field: 'email',
      message: 'Type an e-mail address like name@example.org',
    },
    {
      route: 'POST /api/auth/sign-in',
      body: { email: 'wil@benchtide.test' },
      field: 'password',
      message: 'Password is required',
    },
    {
      route: 'POST /api/auth/verify',
      body: { token: 'short' },
      field: 'token',
      message: 'The link is incomplete or mistyped',
    },
    { route: 'POST /api/auth/verify/resend', body: {}, field: 'email', message: 'E-mail is required' },
    { route: 'POST /api/auth/forgot', body: { email: 42 }, field: 'email', message: 'E-mail is required' },
    {
      route: 'POST /api/auth/reset',
      body: { token: 'x'.repeat(40), newPassword: 'short' },
      field: 'newPassword',
      message: 'Password must be at least 10 characters',
    },
    { route: 'PATCH /api/account', body: { displayName: '' }, field: 'displayName', message: 'Name is required' },
    {
      route: 'POST /api/account/password',
      body: { currentPassword: '', newPassword: 'long enough pass' },
      field: 'currentPassword',
      message: 'Current password is required',
    },
    { route: 'DELETE /api/account', body: {}, field: 'password', message: 'Password is required' },
    {
      route: 'POST /api/workshops',
      body: { name: 'x'.repeat(81) },
      field: 'name',
      message: 'Workshop name must be at most 80 characters',
    },
    { route: 'PATCH /api/workshops/:id', body: { name: '' }, field: 'name', message: 'Workshop name is required' },
    {
      route: 'PATCH /api/workshops/:id/members/:me',
      body: { role: 'admin' },
      field: 'role',
      message: 'Role must be owner, builder or viewer',
    },
    {
      route: 'POST /api/workshops/:id/invitations',
      body: { email: 'guest@benchtide.test', role: 'boss' },
      field: 'role',
      message: 'Role must be owner, builder or viewer',
    },
  ];

  for (const { route, body, field, message } of cases) {
    it(`should refuse ${route} with a message for ${field} and change nothing`, async () => {
      const [method, template] = route.split(' ') as ['POST' | 'PATCH' | 'DELETE', string];
      const path = template.replace(':id', workshopId).replace(':me', owner.id);
      const before = await rowCounts(server);

      const verb = method.toLowerCase() as 'post' | 'patch' | 'delete';
      const response = await request(server.app)[verb](path).set('Cookie', owner.cookie).send(body);

      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('invalid');
      expect(response.body.error.fields[field]).toBe(message);
      expect(await rowCounts(server)).toBe(before);
    });
  }
});
