import request from 'supertest';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { testServer } from '../support/test-app.js';

describe('a field left out of a body', () => {
  it('when a schema field has no message of its own, then the refusal says it is required in plain words', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Mia');
    await makeWorkshop(server.ctx, owner);

    const response = await request(server.app).post('/api/sync/push').set('Cookie', owner.cookie).send({});

    expect(response.status).toBe(400);
    expect(response.body.error.fields.mutations).toBe('This is required');
  });
});
