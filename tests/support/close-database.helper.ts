import { closeTestMailSink, removeTestPhotoDir } from './test-app.js';
import { closeTestDatabase } from './test-database.js';

afterAll(async () => {
  await closeTestDatabase();
  await closeTestMailSink();
  removeTestPhotoDir();
});
