import request from 'supertest';
import { browserKeys } from '../support/fake-push-service.js';
import { makeAccount } from '../support/accounts.js';
import { testServer, type TestServer } from '../support/test-app.js';

describe('reminder settings routes', () => {
  let server: TestServer;

  beforeAll(async () => {
    server = await testServer();
  });

  it('should answer the defaults until saved, then what was saved', async () => {
    const account = await makeAccount(server.ctx, 'Lorcan');
    const first = await request(server.app).get('/api/account/reminders').set('Cookie', account.cookie).expect(200);
    expect(first.body.preferences).toEqual({
      kinds: ['next-layer-due', 'recoat-window-closes', 'demould', 'full-cure', 'shelf-digest'],
      channels: ['push'],
      quietHours: { from: '22:00', until: '07:00' },
      timeZone: 'UTC',
      recoatLeadMin: 30,
    });
    expect(first.body.saved).toBeFalse();
    const chosen = {
      kinds: ['full-cure'],
      channels: ['email', 'push'],
      quietHours: { from: '23:00', until: '06:30' },
      timeZone: 'Europe/Lisbon',
    };
    await request(server.app).put('/api/account/reminders').set('Cookie', account.cookie).send(chosen).expect(200);
    const after = await request(server.app).get('/api/account/reminders').set('Cookie', account.cookie).expect(200);
    // No lead chosen: the default stays.
    expect(after.body.preferences).toEqual({ ...chosen, recoatLeadMin: 30 });
    expect(after.body.saved).toBeTrue();
  });

  it('should keep a chosen recoat lead when later choices leave it out, and refuse one past 12 hours', async () => {
    const account = await makeAccount(server.ctx, 'Oisin');
    const put = (body: object) =>
      request(server.app).put('/api/account/reminders').set('Cookie', account.cookie).send(body);
    const choice = { kinds: ['recoat-window-closes'], channels: ['email'], quietHours: null, timeZone: 'UTC' };
    await put({ ...choice, recoatLeadMin: 90 }).expect(200);
    await put(choice).expect(200);
    const refused = await put({ ...choice, recoatLeadMin: 721 }).expect(400);
    expect(JSON.stringify(refused.body)).toContain('at most 720 minutes');
    await put({ ...choice, recoatLeadMin: 12.5 }).expect(400);
    const kept = await request(server.app).get('/api/account/reminders').set('Cookie', account.cookie).expect(200);
    expect(kept.body.preferences.recoatLeadMin).toBe(90);
  });

  it('should refuse a bad time and an unknown zone with field messages, keeping what was saved', async () => {
    const account = await makeAccount(server.ctx, 'Maeve');
    const answer = await request(server.app)
      .put('/api/account/reminders')
      .set('Cookie', account.cookie)
      .send({ kinds: [], channels: ['sms'], quietHours: { from: '7pm', until: '07:00' }, timeZone: 'Moon/Base' })
      .expect(400);
    expect(JSON.stringify(answer.body)).toContain('Choose a time zone from the list');
    const kept = await request(server.app).get('/api/account/reminders').set('Cookie', account.cookie).expect(200);
    expect(kept.body.preferences.timeZone).toBe('UTC');
  });

  it('should keep a push address once, list it without its keys, and forget it', async () => {
    const account = await makeAccount(server.ctx, 'Nuala');
    const subscription = { endpoint: 'https://push.invalid/nuala-phone', keys: browserKeys(), label: 'Phone' };
    for (let i = 0; i < 2; i += 1) {
      await request(server.app)
        .post('/api/account/push-subscriptions')
        .set('Cookie', account.cookie)
        .send(subscription)
        .expect(204);
    }
    const listed = await request(server.app).get('/api/account/reminders').set('Cookie', account.cookie).expect(200);
    expect(listed.body.devices.map((d: { label: string }) => d.label)).toEqual(['Phone']);
    expect(JSON.stringify(listed.body)).not.toContain(subscription.keys.auth);
    await request(server.app)
      .delete('/api/account/push-subscriptions')
      .set('Cookie', account.cookie)
      .send({ endpoint: subscription.endpoint })
      .expect(204);
    const none = await request(server.app).get('/api/account/reminders').set('Cookie', account.cookie).expect(200);
    expect(none.body.devices).toEqual([]);
  });

  it('should refuse a push address that is not https in production', async () => {
    const production = await testServer({ production: true });
    const account = await makeAccount(production.ctx, 'Oisin');
    const answer = await request(production.app)
      .post('/api/account/push-subscriptions')
      .set('Cookie', account.cookie)
      .send({ endpoint: 'http://127.0.0.1:9/push', keys: browserKeys() })
      .expect(422);
    expect(answer.body.error.message).toBe('Push addresses must use https.');
  });

  it('should give every caller the same VAPID public key', async () => {
    const one = await request(server.app).get('/api/reminders/push-key').expect(200);
    const two = await request(server.app).get('/api/reminders/push-key').expect(200);
    expect(one.body.publicKey).toMatch(/^[A-Za-z0-9_-]{87}$/);
    expect(two.body.publicKey).toBe(one.body.publicKey);
  });

  it('should refuse keys no browser would send, which could never be encrypted for', async () => {
    const account = await makeAccount(server.ctx, 'Ronan');
    const answer = await request(server.app)
      .post('/api/account/push-subscriptions')
      .set('Cookie', account.cookie)
      .send({ endpoint: 'https://push.invalid/short', keys: { p256dh: 'BPxq3Jm0Jd8', auth: 'c2VjcmV0' } })
      .expect(400);
    expect(JSON.stringify(answer.body)).toContain('The browser key is not in the expected form');
  });
});
