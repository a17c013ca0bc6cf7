import request from 'supertest';
import { linkIn } from '../../server/mail/mail-sink.js';
import { GOOD_PASSWORD, makeAccount, uniqueEmail } from '../support/accounts.js';
import { testServer, type TestServer } from '../support/test-app.js';

function tokenFrom(url: string): string {
  return new URL(url).searchParams.get('token') ?? url.split('/').pop()!;
}

function sessionCookie(response: request.Response): string {
  const cookies = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  const cookie = cookies.find(
    (value) => value.startsWith('benchtide_session=') && !value.startsWith('benchtide_session=;'),
  );
  if (!cookie) throw new Error('no session cookie was set');
  return cookie;
}

describe('accounts', () => {
  let server: TestServer;

  beforeAll(async () => {
    server = await testServer();
  });

  describe('when someone signs up, confirms and signs in', () => {
    it('should send a confirmation link, refuse sign-in until it is followed, then sign in', async () => {
      const email = uniqueEmail('Ada');
      const signUp = await request(server.app)
        .post('/api/auth/sign-up')
        .send({ email, displayName: 'Ada', password: GOOD_PASSWORD });
      expect(signUp.status).toBe(202);

      const early = await request(server.app).post('/api/auth/sign-in').send({ email, password: GOOD_PASSWORD });
      expect(early.status).toBe(403);
      expect(early.body.error.code).toBe('email_not_verified');

      const message = await server.mail.waitFor(email, (m) => m.subject.includes('Confirm'));
      expect(message.html).toContain('Confirm my e-mail');
      const verified = await request(server.app)
        .post('/api/auth/verify')
        .send({ token: tokenFrom(linkIn(message)) });
      expect(verified.status).toBe(200);

      const signIn = await request(server.app).post('/api/auth/sign-in').send({ email, password: GOOD_PASSWORD });
      expect(signIn.status).toBe(200);
      expect(signIn.body.account.email).toBe(email);
      expect(signIn.body.workshops).toEqual([jasmine.objectContaining({ personal: true, role: 'owner' })]);

      const me = await request(server.app).get('/api/account').set('Cookie', sessionCookie(signIn).split(';')[0]!);
      expect(me.status).toBe(200);
      expect(me.body.account.displayName).toBe('Ada');
    });

    it('should refuse a confirmation link the second time', async () => {
      const email = uniqueEmail('Bo');
      await request(server.app).post('/api/auth/sign-up').send({ email, displayName: 'Bo', password: GOOD_PASSWORD });
      const token = tokenFrom(linkIn(await server.mail.waitFor(email)));

      await request(server.app).post('/api/auth/verify').send({ token }).expect(200);
      const again = await request(server.app).post('/api/auth/verify').send({ token });

      expect(again.status).toBe(400);
      expect(again.body.error.code).toBe('token_invalid');
    });
  });

  describe('the session cookie', () => {
    it('should be HttpOnly and SameSite=Lax, and a new one at every sign-in', async () => {
      const account = await makeAccount(server.ctx, 'Cy');
      const first = await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: GOOD_PASSWORD });
      const second = await request(server.app)
        .post('/api/auth/sign-in')
        .set('Cookie', sessionCookie(first).split(';')[0]!)
        .send({ email: account.email, password: GOOD_PASSWORD });

      const cookie = sessionCookie(second);
      expect(cookie).toContain('HttpOnly');
      expect(cookie).toMatch(/SameSite=Lax/i);
      expect(cookie).not.toContain('Secure');
      expect(cookie.split(';')[0]).not.toBe(sessionCookie(first).split(';')[0]);
      // The session the second sign-in replaced has ended.
      await request(server.app).get('/api/account').set('Cookie', sessionCookie(first).split(';')[0]!).expect(401);
    });

    it('should be Secure when the app is served over HTTPS', async () => {
      const secure = await testServer({ secureCookies: true, publicOrigin: 'https://bench.example.org' });
      const account = await makeAccount(secure.ctx, 'Di');

      const response = await request(secure.app)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: GOOD_PASSWORD });

      expect(sessionCookie(response)).toContain('Secure');
    });
  });

  describe('sign-in refusals', () => {
    it('should answer a wrong password and an unknown address alike', async () => {
      const account = await makeAccount(server.ctx, 'Ed');

      const wrong = await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: 'not the password' });
      const unknown = await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email: uniqueEmail('nobody'), password: 'whatever' });

      expect(wrong.status).toBe(401);
      expect(unknown.status).toBe(401);
      expect(wrong.body).toEqual(unknown.body);
    });

    it('should stop guessing on one account after 8 tries in 15 minutes, and say when to try again', async () => {
      const account = await makeAccount(server.ctx, 'Flo');
      for (let attempt = 0; attempt < 8; attempt += 1) {
        await request(server.app)
          .post('/api/auth/sign-in')
          .send({ email: account.email, password: 'guess' })
          .expect(401);
      }

      const blocked = await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: GOOD_PASSWORD });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.retryAfterMinutes).toBe(15);
      expect(blocked.body.error.message).toBe('Too many attempts. Try again in 15 minutes.');
      expect(blocked.headers['retry-after']).toBe('900');

      server.clock.advanceMinutes(16);
      await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: GOOD_PASSWORD })
        .expect(200);
    });
  });

  describe('sign-up refusals', () => {
    it('should refuse bad input with a message per field and create nothing', async () => {
      const email = uniqueEmail('Gil');

      const response = await request(server.app)
        .post('/api/auth/sign-up')
        .send({ email, displayName: '', password: 'short' });

      expect(response.status).toBe(400);
      expect(response.body.error.fields).toEqual({
        displayName: 'Name is required',
        password: 'Password must be at least 10 characters',
      });
      await request(server.app).post('/api/auth/sign-in').send({ email, password: 'short' }).expect(401);
    });

    it('should refuse one of the most common passwords', async () => {
      const response = await request(server.app)
        .post('/api/auth/sign-up')
        .send({ email: uniqueEmail('Hal'), displayName: 'Hal', password: 'qwertyuiop' });

      expect(response.status).toBe(400);
      expect(response.body.error.fields.password).toContain('most common');
    });

    it('should answer a sign-up with a taken address exactly like a new one, and tell the owner by e-mail', async () => {
      const account = await makeAccount(server.ctx, 'Ivy');
      const fresh = await request(server.app)
        .post('/api/auth/sign-up')
        .send({ email: uniqueEmail('Jo'), displayName: 'Jo', password: GOOD_PASSWORD });

      const taken = await request(server.app)
        .post('/api/auth/sign-up')
        .send({ email: account.email, displayName: 'Someone', password: GOOD_PASSWORD });

      expect(taken.status).toBe(fresh.status);
      expect(taken.body).toEqual(fresh.body);
      expect((await server.mail.waitFor(account.email)).subject).toBe('You already have a Benchtide account');
    });
  });

  describe('a forgotten password', () => {
    it('should answer alike for known and unknown addresses, and reset by the e-mailed link, ending every session', async () => {
      const account = await makeAccount(server.ctx, 'Kit');
      const unknown = await request(server.app)
        .post('/api/auth/forgot')
        .send({ email: uniqueEmail('ghost') });
      const known = await request(server.app).post('/api/auth/forgot').send({ email: account.email });
      expect(known.status).toBe(202);
      expect(known.body).toEqual(unknown.body);

      const token = tokenFrom(linkIn(await server.mail.waitFor(account.email, (m) => m.subject.includes('new'))));
      const newPassword = 'tidal estuary at dusk';
      await request(server.app).post('/api/auth/reset').send({ token, newPassword }).expect(204);

      await request(server.app).get('/api/account').set('Cookie', account.cookie).expect(401);
      await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: newPassword })
        .expect(200);
      await request(server.app).post('/api/auth/reset').send({ token, newPassword: 'another river bend' }).expect(400);
    });

    it('should refuse a reset link older than an hour', async () => {
      const account = await makeAccount(server.ctx, 'Lu');
      await request(server.app).post('/api/auth/forgot').send({ email: account.email }).expect(202);
      const token = tokenFrom(linkIn(await server.mail.waitFor(account.email)));

      server.clock.advanceMinutes(61);
      const late = await request(server.app)
        .post('/api/auth/reset')
        .send({ token, newPassword: 'tidal estuary at dusk' });

      expect(late.status).toBe(400);
      expect(late.body.error.code).toBe('token_invalid');
    });

    it('should refuse an altered token', async () => {
      const account = await makeAccount(server.ctx, 'Mo');
      await request(server.app).post('/api/auth/forgot').send({ email: account.email }).expect(202);
      const token = tokenFrom(linkIn(await server.mail.waitFor(account.email)));
      const altered = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');

      await request(server.app)
        .post('/api/auth/reset')
        .send({ token: altered, newPassword: 'tidal estuary at dusk' })
        .expect(400);
    });
  });

  describe('a signed-in account', () => {
    it('should change its password, keeping this session and ending the others', async () => {
      const account = await makeAccount(server.ctx, 'Ned');
      const { cookie: other } = await server.ctx.sessions.create(account.id);

      await request(server.app)
        .post('/api/account/password')
        .set('Cookie', account.cookie)
        .send({ currentPassword: GOOD_PASSWORD, newPassword: 'slate quarry siding' })
        .expect(204);

      await request(server.app).get('/api/account').set('Cookie', account.cookie).expect(200);
      await request(server.app).get('/api/account').set('Cookie', other.split(';')[0]!).expect(401);
    });

    it('should refuse a password change with a wrong current password', async () => {
      const account = await makeAccount(server.ctx, 'Ola');

      const response = await request(server.app)
        .post('/api/account/password')
        .set('Cookie', account.cookie)
        .send({ currentPassword: 'wrong one', newPassword: 'slate quarry siding' });

      expect(response.status).toBe(400);
      expect(response.body.error.fields.currentPassword).toBe('This is not your current password.');
    });

    it('should sign out everywhere else', async () => {
      const account = await makeAccount(server.ctx, 'Pim');
      const { cookie: other } = await server.ctx.sessions.create(account.id);

      await request(server.app).post('/api/auth/sign-out-others').set('Cookie', account.cookie).expect(204);

      await request(server.app).get('/api/account').set('Cookie', account.cookie).expect(200);
      await request(server.app).get('/api/account').set('Cookie', other.split(';')[0]!).expect(401);
    });

    it('should sign out', async () => {
      const account = await makeAccount(server.ctx, 'Quin');

      await request(server.app).post('/api/auth/sign-out').set('Cookie', account.cookie).expect(204);

      await request(server.app).get('/api/account').set('Cookie', account.cookie).expect(401);
    });
  });
});
