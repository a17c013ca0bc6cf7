import request from 'supertest';
import { openDatabase } from '../../server/db/database.js';
import { testApp } from '../support/test-app.js';

describe('API errors', () => {
  it('should answer an unknown API route with a JSON 404 in our error shape', async () => {
    const app = await testApp();

    const response = await request(app).get('/api/no-such-thing');

    expect(response.status).toBe(404);
    expect(response.body).toEqual({
      error: { code: 'not_found', message: 'There is no API route GET /no-such-thing.' },
    });
  });

  it('should answer malformed JSON with 400 and no stack trace', async () => {
    const app = await testApp();

    const response = await request(app)
      .post('/api/health')
      .set('Content-Type', 'application/json')
      .send('{"depthMm": ');

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('malformed_json');
    expect(JSON.stringify(response.body)).not.toMatch(/at .+\.(ts|js):\d+/);
  });

  it('should refuse a JSON body over the size limit with 413', async () => {
    const app = await testApp();
    const oversized = JSON.stringify({ notes: 'x'.repeat(150 * 1024) });

    const response = await request(app).post('/api/health').set('Content-Type', 'application/json').send(oversized);

    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('body_too_large');
  });

  it('should answer 503 with a retry hint, not 500, while the database cannot be reached', async () => {
    // Port 9 (discard) on loopback: nothing listens, so every connection is refused.
    const unreachable = openDatabase('postgres://benchtide@127.0.0.1:9/benchtide');
    const app = await testApp({}, unreachable);

    const response = await request(app)
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@benchtide.test', password: 'whatever it is' });
    await unreachable.pool.end();

    expect(response.status).toBe(503);
    expect(response.headers['retry-after']).toBe('5');
    expect(response.body.error.code).toBe('database_unavailable');
    expect(JSON.stringify(response.body)).not.toMatch(/ECONNREFUSED|127\.0\.0\.1|at .+\.(ts|js):\d+/);
  });

  it('should set security headers from helmet on every response', async () => {
    const app = await testApp();

    const response = await request(app).get('/api/health');

    expect(response.headers['content-security-policy']).toContain("script-src 'self'");
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});
