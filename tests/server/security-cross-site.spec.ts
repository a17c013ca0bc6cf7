import { once } from 'node:events';
import { request as httpRequest, type IncomingMessage } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { v7 } from 'uuid';
import { MAX_PHOTO_BYTES } from '../../shared/photo-files.js';
import { openApiDocument } from '../../server/openapi/openapi-document.js';
import { makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { benchJpeg, uploadPhoto } from '../support/photos.js';
import { addBuild, api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

const STATE_CHANGING = ['post', 'put', 'patch', 'delete'];

/** How a browser marks a request another page started: by fetch metadata, or by Origin alone in older browsers. */
const FROM_ELSEWHERE: readonly Record<string, string>[] = [
  { 'Sec-Fetch-Site': 'cross-site' },
  // Another host under the same site: SameSite=Lax cookies still go along, so this must be refused too.
  { 'Sec-Fetch-Site': 'same-site', Origin: 'https://photos.bench.example' },
  { Origin: 'https://elsewhere.example' },
];

interface Answer {
  status: number;
  body: { error?: { code?: string } };
}

describe('requests another site starts (CSRF)', () => {
  let server: TestServer;
  let owner: TestAccount;
  let workshopId: string;
  let buildId: string;

  beforeAll(async () => {
    server = await testServer();
  });

  beforeEach(async () => {
    owner = await makeAccount(server.ctx, 'Ada');
    workshopId = (await makeWorkshop(server.ctx, owner)).id;
    buildId = await addBuild(api(server, owner, workshopId));
  });

  const photosOfBuild = async () =>
    (await api(server, owner, workshopId).get(`/builds/${buildId}/photos`).expect(200)).body as unknown[];

  it('should refuse every state-changing route the API describes, even with a signed-in cookie', async () => {
    const refusedWith: Record<string, string[]> = {};
    for (const [path, item] of Object.entries(openApiDocument().paths)) {
      for (const method of Object.keys(item).filter((key) => STATE_CHANGING.includes(key))) {
        const concrete = path.replace('{workshopId}', workshopId).replace(/\{\w+\}/g, () => v7());
        for (const headers of FROM_ELSEWHERE) {
          const call = request(server.app)[method as 'post'](concrete);
          const response = await call.set('Cookie', owner.cookie).set(headers).send({ name: 'Taken over' });
          const route = `${method.toUpperCase()} ${path} ${JSON.stringify(headers)}`;
          (refusedWith[`${response.status} ${response.body.error?.code}`] ??= []).push(route);
        }
      }
    }

    expect(Object.keys(refusedWith)).toEqual(['403 cross_site']);
    expect(refusedWith['403 cross_site']).toEqual(
      jasmine.arrayContaining([
        'POST /api/auth/sign-in {"Sec-Fetch-Site":"cross-site"}',
        'PUT /api/workshops/{workshopId}/photos/{photoId} {"Sec-Fetch-Site":"cross-site"}',
      ]),
    );
  });

  describe('when the request is a photo upload', () => {
    /**
     * Starts a PUT of a photo form that claims 25 MB and sends only its first bytes, and waits for
     * an answer for as long as `waitMs`: the server can only answer that soon if it never read the body.
     */
    async function uploadThatNeverEnds(headers: Record<string, string>, waitMs: number): Promise<Answer | null> {
      const photoStart = (await benchJpeg()).subarray(0, 4096);
      const listening = server.app.listen(0, '127.0.0.1');
      await once(listening, 'listening');
      const { port } = listening.address() as AddressInfo;
      const upload = httpRequest({
        host: '127.0.0.1',
        port,
        method: 'PUT',
        path: `/api/workshops/${workshopId}/photos/${v7()}`,
        headers: {
          Cookie: owner.cookie,
          'Content-Type': 'multipart/form-data; boundary=bench',
          'Content-Length': String(MAX_PHOTO_BYTES),
          ...headers,
        },
      });
      // Listened for before anything is sent, so an early refusal is never missed.
      const answered = once(upload, 'response')
        .then(async ([response]) => {
          const answer = response as IncomingMessage;
          const chunks: Buffer[] = [];
          for await (const chunk of answer) chunks.push(chunk as Buffer);
          return { status: answer.statusCode!, body: JSON.parse(Buffer.concat(chunks).toString('utf8')) } as Answer;
        })
        // Ending the unfinished upload below fails the request: that is no answer.
        .catch(() => null);
      upload.write(
        `--bench\r\nContent-Disposition: form-data; name="buildId"\r\n\r\n${buildId}\r\n` +
          '--bench\r\nContent-Disposition: form-data; name="photo"; filename="bench.jpg"\r\n' +
          'Content-Type: image/jpeg\r\n\r\n',
      );
      upload.write(photoStart);
      let timer: NodeJS.Timeout | undefined;
      try {
        const gaveUp = new Promise<null>((resolve) => (timer = setTimeout(() => resolve(null), waitMs)));
        return await Promise.race([answered, gaveUp]);
      } finally {
        clearTimeout(timer);
        upload.destroy();
        listening.closeAllConnections();
        listening.close();
      }
    }

    it('should refuse it before reading the form', async () => {
      const answer = await uploadThatNeverEnds({ 'Sec-Fetch-Site': 'cross-site' }, 5_000);

      expect(answer).withContext('no answer while the body was still on its way').not.toBeNull();
      expect(answer?.status).toBe(403);
      expect(answer?.body.error?.code).toBe('cross_site');
      expect(await photosOfBuild()).toEqual([]);
    });

    it('should wait for the whole form when the app itself sends it (so the refusal above came first)', async () => {
      const answer = await uploadThatNeverEnds({ 'Sec-Fetch-Site': 'same-origin' }, 500);

      expect(answer).toBeNull();
    });

    it('should keep nothing of a whole photo a member’s browser was made to send', async () => {
      const refused = await uploadPhoto(server, owner, workshopId, v7(), { buildId }, { bytes: await benchJpeg() })
        .set('Sec-Fetch-Site', 'cross-site')
        .expect(403);

      expect(refused.body.error.code).toBe('cross_site');
      expect(await photosOfBuild()).toEqual([]);
    });
  });
});
