import request from 'supertest';
import { uniqueEmail } from '../support/accounts.js';
import { TEST_ORIGIN, testServer } from '../support/test-app.js';

describe('requests from other sites (CSRF)', () => {
  const forgot = () => ({ email: uniqueEmail('csrf') });

  it('should refuse a state-changing request a browser sent from another site', async () => {
    const { app } = await testServer();

    const crossSite = await request(app).post('/api/auth/forgot').set('Sec-Fetch-Site', 'cross-site').send(forgot());
    const otherOrigin = await request(app)
      .post('/api/auth/forgot')
      .set('Origin', 'https://elsewhere.example')
      .send(forgot());

    expect(crossSite.status).toBe(403);
    expect(crossSite.body.error.code).toBe('cross_site');
    expect(otherOrigin.status).toBe(403);
  });

  it('should let our own pages through', async () => {
    const { app } = await testServer();

    await request(app).post('/api/auth/forgot').set('Sec-Fetch-Site', 'same-origin').send(forgot()).expect(202);
    await request(app).post('/api/auth/forgot').set('Origin', TEST_ORIGIN).send(forgot()).expect(202);
  });

  it('should leave reading alone', async () => {
    const { app } = await testServer();

    await request(app).get('/api/health').set('Sec-Fetch-Site', 'cross-site').expect(200);
  });
});
