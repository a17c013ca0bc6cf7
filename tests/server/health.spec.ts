import request from 'supertest';
import { openDatabase } from '../../server/db/database.js';
import { testApp } from '../support/test-app.js';

describe('GET /api/health', () => {
  it('should answer 200 and report the database reachable when it is', async () => {
    const app = await testApp();

    const response = await request(app).get('/api/health');

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok', database: 'reachable' });
    expect(response.headers['cache-control']).toBe('no-store');
  });

  it('should answer 503 and report the database unreachable when nothing listens there', async () => {
    // Port 9 (discard) on loopback: nothing of ours listens, so the connection is refused at once.
    const unreachable = openDatabase('postgres://nobody@127.0.0.1:9/none');
    const app = await testApp({}, unreachable);

    const response = await request(app).get('/api/health');

    expect(response.status).toBe(503);
    expect(response.body).toEqual({ status: 'degraded', database: 'unreachable' });
    await unreachable.pool.end();
  });
});
