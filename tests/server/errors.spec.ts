import request from 'supertest';
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

  it('should set security headers from helmet on every response', async () => {
    const app = await testApp();

    const response = await request(app).get('/api/health');

    expect(response.headers['content-security-policy']).toContain("script-src 'self'");
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});
