import { closeTestDatabase } from './test-database.js';

afterAll(async () => {
  await closeTestDatabase();
});
