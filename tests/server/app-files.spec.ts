import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { testApp } from '../support/test-app.js';

describe('serving the built app', () => {
  let appDir: string;

  beforeAll(() => {
    appDir = mkdtempSync(join(tmpdir(), 'benchtide-app-'));
    writeFileSync(join(appDir, 'index.html'), '<!doctype html><title>Benchtide</title><bt-root></bt-root>');
    writeFileSync(join(appDir, 'main-AB12CD34.js'), `console.log(${JSON.stringify('pour '.repeat(400))});`);
    writeFileSync(join(appDir, 'ngsw.json'), '{"configVersion":1}');
    writeFileSync(join(appDir, 'manifest.webmanifest'), '{"name":"Benchtide"}');
  });

  afterAll(() => rmSync(appDir, { recursive: true, force: true }));

  it('should cache hashed build files for a year', async () => {
    const app = await testApp({ appDir });

    const response = await request(app).get('/main-AB12CD34.js');

    expect(response.status).toBe(200);
    expect(response.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('should never cache index.html, ngsw.json or the manifest', async () => {
    const app = await testApp({ appDir });

    for (const path of ['/', '/ngsw.json', '/manifest.webmanifest']) {
      const response = await request(app).get(path).set('Accept', 'text/html,*/*');
      expect(response.status).withContext(path).toBe(200);
      expect(response.headers['cache-control']).withContext(path).toBe('no-cache');
    }
  });

  it('should compress text responses for clients that accept it', async () => {
    const app = await testApp({ appDir });

    const response = await request(app).get('/main-AB12CD34.js').set('Accept-Encoding', 'br, gzip');

    expect(response.headers['content-encoding']).toMatch(/^(br|gzip)$/);
  });

  it('should answer a deep link in the app with index.html', async () => {
    const app = await testApp({ appDir });

    const response = await request(app).get('/pour-planner').set('Accept', 'text/html');

    expect(response.status).toBe(200);
    expect(response.text).toContain('<bt-root>');
  });

  it('should answer a missing asset with 404, not with index.html', async () => {
    const app = await testApp({ appDir });

    const response = await request(app).get('/chunk-MISSING1.js').set('Accept', '*/*');

    expect(response.status).toBe(404);
  });

  it('should say plainly when the app has not been built', async () => {
    const app = await testApp({ appDir: join(appDir, 'not-built') });

    const response = await request(app).get('/');

    expect(response.status).toBe(503);
    expect(response.text).toContain('npm start');
  });
});
