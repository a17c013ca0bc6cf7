import request from 'supertest';
import { applyMigrations, openDatabase, type DatabaseHandle } from '../../server/db/database.js';
import { DEMO_MEMBERS, DEMO_WORKSHOP, seedDemoWhenEmpty } from '../../server/demo/demo-seed.js';
import { testServer } from '../support/test-app.js';
import { TEST_DATABASE_URL, testDatabase } from '../support/test-database.js';

describe('the demo workshop seed', () => {
  const name = 'benchtide_seed_check';
  let seeded: DatabaseHandle;
  let firstOutcome: string;

  beforeAll(async () => {
    const { pool } = await testDatabase();
    await pool.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await pool.query(`CREATE DATABASE ${name}`);
    const url = new URL(TEST_DATABASE_URL);
    url.pathname = `/${name}`;
    seeded = openDatabase(url.toString());
    await applyMigrations(seeded.db);
    firstOutcome = await seedDemoWhenEmpty(seeded.db);
  }, 30_000);

  afterAll(async () => {
    await seeded.pool.end();
    const { pool } = await testDatabase();
    await pool.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  });

  it('should seed an empty database once, and keep a database that has accounts', async () => {
    expect(firstOutcome).toBe('seeded');
    expect(await seedDemoWhenEmpty(seeded.db)).toBe('kept');
  });

  it('should let each README sign-in in with its role in the demo workshop', async () => {
    const { app } = await testServer({}, seeded);
    for (const member of DEMO_MEMBERS) {
      const response = await request(app)
        .post('/api/auth/sign-in')
        .send({ email: member.email, password: member.password });
      expect(response.status).withContext(member.email).toBe(200);
      expect(response.body.workshops)
        .withContext(member.email)
        .toContain(jasmine.objectContaining({ name: DEMO_WORKSHOP, role: member.role }));
    }
  });
});
