import { randomInt } from 'node:crypto';
import request from 'supertest';
import { readConfig } from '../../server/config.js';
import { LIMITS } from '../../server/auth/rate-limit.js';
import { GOOD_PASSWORD, uniqueEmail } from '../support/accounts.js';
import { testApp } from '../support/test-app.js';

describe('readConfig', () => {
  it('should default to loopback on port 3000', () => {
    const config = readConfig({});

    expect(config.host).toBe('127.0.0.1');
    expect(config.port).toBe(3000);
    expect(config.production).toBeFalse();
  });

  it('should take PORT and DATABASE_URL from the environment', () => {
    const config = readConfig({ PORT: '8080', DATABASE_URL: 'postgres://someone@db.internal/bench' });

    expect(config.port).toBe(8080);
    expect(config.databaseUrl).toBe('postgres://someone@db.internal/bench');
  });

  it('should refuse a PORT that is not a port number', () => {
    expect(() => readConfig({ PORT: 'eighty' })).toThrowError(/PORT must be a whole number/);
  });

  it('should trust as many proxies as TRUST_PROXY names, and none unless told', () => {
    expect(readConfig({}).trustProxy).toBe(0);
    expect(readConfig({ TRUST_PROXY: '' }).trustProxy).toBe(0);
    expect(readConfig({ TRUST_PROXY: '1' }).trustProxy).toBe(1);
    expect(readConfig({ TRUST_PROXY: '2' }).trustProxy).toBe(2);
  });

  it('should refuse a TRUST_PROXY that is not a number of proxies', () => {
    for (const value of ['yes', 'true', '-1', '1.5']) {
      expect(() => readConfig({ TRUST_PROXY: value }))
        .withContext(value)
        .toThrowError(/TRUST_PROXY must be the number of proxies/);
    }
  });

  describe('behind one load balancer (TRUST_PROXY=1)', () => {
    it('should count sign-in attempts by the address the balancer saw, whatever the client wrote before it', async () => {
      const app = await testApp({ trustProxy: 1 });
      // The balancer appends the address it saw to whatever X-Forwarded-For the client sent.
      const seenByBalancer = `203.0.113.${randomInt(1, 255)}`;
      const attempt = (i: number) =>
        request(app)
          .post('/api/auth/sign-in')
          .set('X-Forwarded-For', `198.51.100.${i % 250}, ${seenByBalancer}`)
          .send({ email: uniqueEmail('nobody'), password: GOOD_PASSWORD });

      for (let i = 0; i < LIMITS.signInByAddress.max; i += 1) await attempt(i).expect(401);
      const refused = await attempt(LIMITS.signInByAddress.max);

      expect(refused.status).toBe(429);
      expect(refused.body.error.code).toBe('rate_limited');
    }, 30_000);
  });
});
