import request from 'supertest';
import { SESSION_COOKIE } from '../../server/auth/lucia-session-store.js';
import { linkIn } from '../../server/mail/mail-sink.js';
import { GOOD_PASSWORD, makeAccount } from '../support/accounts.js';
import { testServer, type TestServer } from '../support/test-app.js';

interface SetCookie {
  value: string;
  /** Attribute names in lower case; `true` for a flag such as HttpOnly. */
  attributes: Record<string, string | true>;
}

/** The session cookie a response sets, read apart; fails when there is none. */
function sessionCookieSet(response: request.Response): SetCookie {
  const headers = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  const found = headers.filter((header) => header.startsWith(`${SESSION_COOKIE}=`));
  if (found.length !== 1) throw new Error(`expected one ${SESSION_COOKIE} cookie, got ${found.length}`);
  const [pair, ...attributes] = found[0]!.split(';').map((part) => part.trim());
  return {
    value: pair!.slice(SESSION_COOKIE.length + 1),
    attributes: Object.fromEntries(
      attributes.map((attribute) => {
        const [name, value] = attribute.split('=');
        return [name!.toLowerCase(), value ?? true];
      }),
    ),
  };
}

/** What decides which cookie a browser replaces, and how it may be used: all but its lifetime. */
function scopeOf(cookie: SetCookie): Record<string, string | true> {
  const { 'max-age': _maxAge, expires: _expires, ...scope } = cookie.attributes;
  return scope;
}

describe('the session cookie (security)', () => {
  let server: TestServer;

  beforeAll(async () => {
    server = await testServer();
  });

  async function signIn(on: TestServer = server) {
    const account = await makeAccount(on.ctx, 'Ada');
    const response = await request(on.app)
      .post('/api/auth/sign-in')
      .send({ email: account.email, password: GOOD_PASSWORD })
      .expect(200);
    const cookie = sessionCookieSet(response);
    return { account, cookie, header: `${SESSION_COOKIE}=${cookie.value}` };
  }

  it('should go with every request to the site, to this host alone, out of reach of scripts, for a limited time', async () => {
    const { cookie } = await signIn();

    expect(cookie.value).toMatch(/^[a-z0-9]{20,}$/);
    expect(cookie.attributes['path']).toBe('/');
    expect(cookie.attributes['domain']).toBeUndefined();
    expect(cookie.attributes['httponly']).toBeTrue();
    expect(cookie.attributes['samesite']).toMatch(/^lax$/i);
    expect(Number(cookie.attributes['max-age'])).toBeGreaterThan(0);
    expect(Number(cookie.attributes['max-age'])).toBeLessThanOrEqual(31 * 24 * 3600);
  });

  for (const over of ['HTTP', 'HTTPS'] as const) {
    it(`should be cleared at sign-out with the same scope it was set with, over ${over}`, async () => {
      const on =
        over === 'HTTPS'
          ? await testServer({ secureCookies: true, publicOrigin: 'https://bench.example.org' })
          : server;
      const { cookie, header } = await signIn(on);

      const signedOut = await request(on.app).post('/api/auth/sign-out').set('Cookie', header).expect(204);

      const cleared = sessionCookieSet(signedOut);
      expect(cleared.value).toBe('');
      expect(cleared.attributes['max-age']).toBe('0');
      expect(scopeOf(cleared)).toEqual(scopeOf(cookie));
      expect(cleared.attributes['secure'] === true).toBe(over === 'HTTPS');
      await request(on.app).get('/api/account').set('Cookie', header).expect(401);
    });
  }

  it('should clear a cookie whose session has ended on the next request that brings it', async () => {
    const { header } = await signIn();
    await request(server.app).post('/api/auth/sign-out').set('Cookie', header).expect(204);

    const later = await request(server.app).get('/api/account').set('Cookie', header);

    expect(later.status).toBe(401);
    expect(sessionCookieSet(later).attributes['max-age']).toBe('0');
  });

  it('should clear it when the password is reset from the e-mailed link', async () => {
    const { account, header } = await signIn();
    await request(server.app).post('/api/auth/forgot').send({ email: account.email }).expect(202);
    const link = linkIn(await server.mail.waitFor(account.email, (m) => m.subject.includes('new')));
    const token = new URL(link).searchParams.get('token') ?? link.split('/').pop()!;

    const reset = await request(server.app)
      .post('/api/auth/reset')
      .set('Cookie', header)
      .send({ token, newPassword: 'tidal estuary at dusk' })
      .expect(204);

    expect(sessionCookieSet(reset).value).toBe('');
    expect(sessionCookieSet(reset).attributes['max-age']).toBe('0');
    await request(server.app).get('/api/account').set('Cookie', header).expect(401);
  });
});
