import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { v7 } from 'uuid';
import { readConfig } from '../../server/config.js';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { benchJpeg, uploadPhoto } from '../support/photos.js';
import { addBuild, api } from '../support/shelf.js';
import { testApp, testServer } from '../support/test-app.js';

/** "default-src 'self'; img-src 'self' data:" as { 'default-src': ["'self'"], 'img-src': ["'self'", 'data:'] }. */
function policyOf(response: request.Response): Record<string, string[]> {
  const header = response.headers['content-security-policy'] as string | undefined;
  if (!header) throw new Error('no Content-Security-Policy was sent');
  return Object.fromEntries(
    header
      .split(';')
      .map((directive) => directive.trim().split(/\s+/))
      .filter(([name]) => name)
      .map(([name, ...sources]) => [name!, sources]),
  );
}

/** Nothing a client is told should point into the server's code. */
const STACK_FRAME = /at .+\.(ts|js|mjs):\d+|node_modules|\/server\//;

describe('security headers', () => {
  let appDir: string;

  beforeAll(() => {
    appDir = mkdtempSync(join(tmpdir(), 'benchtide-headers-'));
    writeFileSync(join(appDir, 'index.html'), '<!doctype html><title>Benchtide</title><bt-root></bt-root>');
  });

  afterAll(() => rmSync(appDir, { recursive: true, force: true }));

  describe('on an API answer and on the app page', () => {
    async function answers(overrides: Parameters<typeof testApp>[0] = {}) {
      const app = await testApp({ appDir, ...overrides });
      return {
        api: await request(app).get('/api/health'),
        page: await request(app).get('/workbench').set('Accept', 'text/html'),
      };
    }

    it('should send a policy that lets scripts come only from the app itself', async () => {
      for (const [which, response] of Object.entries(await answers())) {
        const policy = policyOf(response);
        expect(policy['default-src']).withContext(which).toEqual(["'self'"]);
        expect(policy['script-src']).withContext(which).toEqual(["'self'"]);
        expect(policy['script-src-attr']).withContext(which).toEqual(["'none'"]);
        expect(policy['object-src']).withContext(which).toEqual(["'none'"]);
        expect(policy['base-uri']).withContext(which).toEqual(["'self'"]);
        expect(policy['form-action']).withContext(which).toEqual(["'self'"]);
        expect(policy['connect-src']).withContext(which).toEqual(["'self'"]);
        expect(policy['worker-src']).withContext(which).toEqual(["'self'"]);
        expect(policy['img-src']).withContext(which).toEqual(["'self'", 'data:', 'blob:']);
      }
    });

    it('should refuse to be framed by another site', async () => {
      for (const [which, response] of Object.entries(await answers())) {
        expect(policyOf(response)['frame-ancestors']).withContext(which).toEqual(["'self'"]);
        expect(response.headers['x-frame-options']).withContext(which).toBe('SAMEORIGIN');
      }
    });

    it('should stop sniffing, referrers, cross-origin openers and cross-origin embedding, and not name the framework', async () => {
      for (const [which, response] of Object.entries(await answers())) {
        expect(response.headers['x-content-type-options']).withContext(which).toBe('nosniff');
        expect(response.headers['referrer-policy']).withContext(which).toBe('no-referrer');
        expect(response.headers['cross-origin-opener-policy']).withContext(which).toBe('same-origin');
        expect(response.headers['cross-origin-resource-policy']).withContext(which).toBe('same-origin');
        expect(response.headers['x-powered-by']).withContext(which).toBeUndefined();
      }
    });

    it('should leave HTTPS alone while the app runs for development', async () => {
      for (const [which, response] of Object.entries(await answers({ production: false }))) {
        expect(response.headers['strict-transport-security']).withContext(which).toBeUndefined();
        expect(policyOf(response)['upgrade-insecure-requests']).withContext(which).toBeUndefined();
      }
    });

    it('should hold browsers to HTTPS for a year in production, and upgrade requests behind a proxy that ends TLS', async () => {
      const { production, trustProxy } = readConfig({ NODE_ENV: 'production', TRUST_PROXY: '1' });
      for (const [which, response] of Object.entries(await answers({ production, trustProxy }))) {
        const hsts = response.headers['strict-transport-security'] as string | undefined;
        expect(hsts)
          .withContext(which)
          .toMatch(/^max-age=(\d+);/);
        expect(Number(/max-age=(\d+)/.exec(hsts ?? '')?.[1]))
          .withContext(which)
          .toBeGreaterThanOrEqual(31_536_000);
        expect(policyOf(response)['upgrade-insecure-requests']).withContext(which).toEqual([]);
      }
    });
  });

  describe('on error answers', () => {
    it('should answer an unknown API route with our error shape alone', async () => {
      const app = await testApp({ appDir });

      const response = await request(app).delete('/api/workshops/no-such/thing');

      expect(response.status).toBe(404);
      expect(Object.keys(response.body)).toEqual(['error']);
      expect(Object.keys(response.body.error).sort()).toEqual(['code', 'message']);
      expect(response.text).not.toMatch(STACK_FRAME);
    });

    it('should answer a failure inside the server with 500 and no word of what failed or where', async () => {
      const server = await testServer({ appDir });
      const account = await makeAccount(server.ctx, 'Ada');
      spyOn(server.ctx.sessions, 'validate').and.rejectWith(
        new TypeError("Cannot read properties of undefined (reading 'passwordHash')"),
      );

      const response = await request(server.app).get('/api/account').set('Cookie', account.cookie);

      expect(response.status).toBe(500);
      expect(response.body).toEqual({
        error: { code: 'internal', message: 'Something went wrong on the server. Nothing was saved.' },
      });
      expect(response.text).not.toMatch(STACK_FRAME);
      expect(response.text).not.toContain('passwordHash');
    });

    it('should answer an id that cannot be decoded, and a file the app lacks, with no stack trace', async () => {
      const app = await testApp({ appDir });

      const undecodable = await request(app).get('/api/workshops/%E0%A4%A/builds');
      const missing = await request(app).get('/chunk-%E0%A4%A.js');

      expect([undecodable.status, missing.status]).toEqual([400, 404]);
      expect(undecodable.text).not.toMatch(STACK_FRAME);
      expect(missing.text).not.toMatch(STACK_FRAME);
    });
  });

  describe('on a photo copy', () => {
    it('should be kept by the browser alone, never by a shared cache, and never sniffed as another type', async () => {
      const server = await testServer();
      const owner = await makeAccount(server.ctx, 'Bo');
      const workshopId = (await makeWorkshop(server.ctx, owner)).id;
      const buildId = await addBuild(api(server, owner, workshopId));
      const photoId = v7();
      await uploadPhoto(server, owner, workshopId, photoId, { buildId }, { bytes: await benchJpeg() }).expect(201);

      for (const size of ['display', 'thumb']) {
        const response = await request(server.app)
          .get(`/api/workshops/${workshopId}/photos/${photoId}/${size}`)
          .set('Cookie', owner.cookie);
        expect(response.status).withContext(size).toBe(200);
        expect(response.headers['content-type']).withContext(size).toBe('image/jpeg');
        expect(response.headers['cache-control'])
          .withContext(size)
          .toMatch(/^private(,|$)/);
        expect(response.headers['cache-control']).withContext(size).not.toContain('public');
        expect(response.headers['x-content-type-options']).withContext(size).toBe('nosniff');
      }
    });
  });
});
