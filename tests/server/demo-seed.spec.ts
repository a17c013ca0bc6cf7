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
    firstOutcome = await seedDemoWhenEmpty((await testServer({}, seeded)).ctx);
  }, 30_000);

  afterAll(async () => {
    await seeded.pool.end();
    const { pool } = await testDatabase();
    await pool.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  });

  it('should seed an empty database once, and keep a database that has accounts', async () => {
    expect(firstOutcome).toBe('seeded');
    expect(await seedDemoWhenEmpty((await testServer({}, seeded)).ctx)).toBe('kept');
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

  it('should give the demo club builds at three scales, a shelf and costed pours', async () => {
    const { app } = await testServer({}, seeded);
    const owner = DEMO_MEMBERS[0]!;
    const signIn = await request(app).post('/api/auth/sign-in').send({ email: owner.email, password: owner.password });
    const cookie = ([] as string[]).concat(signIn.headers['set-cookie'] ?? [])[0]!.split(';')[0]!;
    const club = (signIn.body.workshops as { id: string; name: string }[]).find((w) => w.name === DEMO_WORKSHOP)!;
    const get = (path: string) => request(app).get(`/api/workshops/${club.id}${path}`).set('Cookie', cookie);

    const builds = (await get('/builds')).body as { scaleRatio: number }[];
    const shelf = (await get('/shelf')).body as { measure: string | null; remainingByUnit: object }[];
    const costs = (await get('/costs')).body as { byBuild: { costMinor: number }[] };

    expect(builds.map((build) => build.scaleRatio).sort((a, b) => a - b)).toEqual([35, 87.1, 160]);
    // three pour materials and two that are not poured: foam board by area, figures in pieces
    expect(shelf.length).toBe(5);
    expect(
      shelf
        .map((entry) => entry.measure)
        .filter(Boolean)
        .sort(),
    ).toEqual(['area', 'count']);
    expect(shelf.map((entry) => entry.remainingByUnit)).toContain({ m2: 0.72 });
    expect(costs.byBuild.length).toBe(2);
    expect(costs.byBuild.every((line) => line.costMinor > 0)).toBeTrue();
  });
});
