import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { v7 } from 'uuid';
import type { PhotoRecord } from '../../shared/photo-schemas.js';
import type { PulledChange } from '../../shared/sync-schemas.js';
import { addMember, GOOD_PASSWORD, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { benchJpeg, uploadPhoto } from '../support/photos.js';
import { addBuild, api, type Api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

describe('bench photos once uploaded', () => {
  let server: TestServer;
  let photoDir: string;
  let owner: TestAccount;
  let viewer: TestAccount;
  let workshopId: string;
  let client: Api;
  let buildId: string;

  beforeAll(async () => {
    photoDir = mkdtempSync(join(tmpdir(), 'benchtide-photo-spec-'));
    server = await testServer({ photoStore: { kind: 'disk', dir: photoDir } });
  });

  afterAll(() => rmSync(photoDir, { recursive: true, force: true }));

  beforeEach(async () => {
    owner = await makeAccount(server.ctx, 'Bo');
    viewer = await makeAccount(server.ctx, 'Cy');
    workshopId = (await makeWorkshop(server.ctx, owner)).id;
    await addMember(server.ctx, workshopId, viewer, 'viewer');
    client = api(server, owner, workshopId);
    buildId = await addBuild(client);
  });

  async function addPhoto(build = buildId, caption = ''): Promise<PhotoRecord> {
    const answer = await uploadPhoto(
      server,
      owner,
      workshopId,
      v7(),
      { buildId: build, caption },
      { bytes: await benchJpeg() },
    );
    expect(answer.status).toBe(201);
    return answer.body as PhotoRecord;
  }

  const copyPath = (photo: PhotoRecord, size: 'display' | 'thumb') =>
    join(photoDir, workshopId, `${photo.id}.${photo.contentHash}.${size}.jpg`);
  const filesKept = (photo: PhotoRecord) => [copyPath(photo, 'display'), copyPath(photo, 'thumb')].map(existsSync);
  const fetchCopy = (account: TestAccount | null, photo: PhotoRecord, size = 'display') => {
    const call = request(server.app).get(`/api/workshops/${workshopId}/photos/${photo.id}/${size}`);
    return account ? call.set('Cookie', account.cookie) : call;
  };
  const push = (account: TestAccount, mutations: unknown[]) =>
    request(server.app).post('/api/sync/push').set('Cookie', account.cookie).send({ workshopId, mutations });

  async function pulled(entity: string, id: string): Promise<PulledChange[]> {
    const page = await request(server.app)
      .get('/api/sync/pull')
      .query({ workshopId, after: 0, limit: 1000 })
      .set('Cookie', owner.cookie)
      .expect(200);
    return (page.body.changes as PulledChange[]).filter(
      (change) => change.entity === entity && change.record.id === id,
    );
  }

  describe('serving', () => {
    it('should serve copies to members only: a viewer 200, a stranger 404, the signed-out 401', async () => {
      const photo = await addPhoto();
      const stranger = await makeAccount(server.ctx, 'Di');

      await fetchCopy(viewer, photo, 'thumb').expect(200);
      const strangers = await fetchCopy(stranger, photo).expect(404);
      await fetchCopy(null, photo).expect(401);

      expect(strangers.body.error.code).toBe('workshop_unknown');
    });

    it('should answer an unknown size or photo with 404', async () => {
      const photo = await addPhoto();

      await fetchCopy(owner, photo, 'original').expect(404);
      await fetchCopy(owner, { ...photo, id: v7() }).expect(404);
    });

    it("should refuse a viewer's upload with 403, keeping nothing", async () => {
      const photoId = v7();

      const refused = await uploadPhoto(server, viewer, workshopId, photoId, { buildId }, { bytes: await benchJpeg() });

      expect(refused.status).toBe(403);
      expect(existsSync(join(photoDir, workshopId))).toBeFalse();
    });

    it("should list a build's live photos as records, without where the server stores them", async () => {
      const kept = await addPhoto(buildId, 'Kept');
      const gone = await addPhoto(buildId, 'Gone');
      await addPhoto(await addBuild(client), 'Elsewhere');
      await client.delete(`/photos/${gone.id}`).expect(204);

      const listed = await api(server, viewer, workshopId).get(`/builds/${buildId}/photos`).expect(200);

      expect(listed.body).toEqual([kept]);
    });
  });

  describe('syncing', () => {
    it('should carry a new photo to other devices by pull, as the record the upload answered', async () => {
      const photo = await addPhoto();

      const changes = await pulled('photo', photo.id);

      expect(changes).toEqual([{ entity: 'photo', changeNumber: photo.changeNumber, record: { ...photo } }]);
    });

    it('should change a caption by sync push, and refuse a viewer doing the same', async () => {
      const photo = await addPhoto();
      const patch = (caption: string) => ({
        type: 'photo.patch',
        mutationId: v7(),
        recordId: photo.id,
        data: { caption },
      });

      const answer = await push(owner, [patch('Gloss coat, day two')]).expect(200);
      const refused = await push(viewer, [patch('Mine now')]).expect(200);

      expect(answer.body.results[0].status).toBe('applied');
      expect(refused.body.results[0].reason.code).toBe('forbidden');
      const [change] = await pulled('photo', photo.id);
      expect(change!.record['caption']).toBe('Gloss coat, day two');
    });

    it('should delete by sync push: a tombstone for every device, the files gone, nothing served', async () => {
      const photo = await addPhoto();
      expect(filesKept(photo)).toEqual([true, true]);

      const answer = await push(owner, [{ type: 'photo.delete', mutationId: v7(), recordId: photo.id }]).expect(200);

      expect(answer.body.results[0].status).toBe('applied');
      expect(filesKept(photo)).toEqual([false, false]);
      const [change] = await pulled('photo', photo.id);
      expect(change!.record.deletedAt).toEqual(jasmine.any(String));
      expect(change!.changeNumber).toBe(answer.body.results[0].changeNumber);
      await fetchCopy(owner, photo).expect(404);
    });

    it('should remove the files when a refusal later in the batch has the batch done again', async () => {
      const photo = await addPhoto();

      const answer = await push(owner, [
        { type: 'photo.delete', mutationId: v7(), recordId: photo.id },
        { type: 'photo.delete', mutationId: v7(), recordId: photo.id },
      ]).expect(200);

      expect(answer.body.results.map((result: { status: string }) => result.status)).toEqual(['applied', 'rejected']);
      expect(filesKept(photo)).toEqual([false, false]);
    });

    it('should keep the files of a photo whose delete was refused', async () => {
      const photo = await addPhoto();
      const other = await addPhoto();

      const answer = await push(viewer, [{ type: 'photo.delete', mutationId: v7(), recordId: photo.id }]).expect(200);
      await push(owner, [
        { type: 'photo.delete', mutationId: v7(), recordId: other.id },
        { type: 'photo.patch', mutationId: v7(), recordId: other.id, data: { caption: 'Too late' } },
      ]).expect(200);

      expect(answer.body.results[0].status).toBe('rejected');
      expect(filesKept(photo)).toEqual([true, true]);
      expect(filesKept(other)).toEqual([false, false]);
    });
  });

  describe('covers', () => {
    it("should set a build's cover to one of its photos, and clear it with null", async () => {
      const photo = await addPhoto();

      const set = await client.patch(`/builds/${buildId}`, { coverPhotoId: photo.id }).expect(200);
      const cleared = await client.patch(`/builds/${buildId}`, { coverPhotoId: null }).expect(200);

      expect(set.body.coverPhotoId).toBe(photo.id);
      expect(cleared.body.coverPhotoId).toBeNull();
    });

    it('should set and refuse covers by sync push just as by the build route', async () => {
      const photo = await addPhoto();
      const elsewhere = await addPhoto(await addBuild(client));
      const cover = (coverPhotoId: string | null) => ({
        type: 'build.patch',
        mutationId: v7(),
        recordId: buildId,
        data: { coverPhotoId },
      });

      const answer = await push(owner, [cover(photo.id), cover(elsewhere.id)]).expect(200);

      expect(answer.body.results.map((result: { status: string }) => result.status)).toEqual(['applied', 'rejected']);
      expect(answer.body.results[1].reason.code).toBe('cover_not_in_build');
      const [build] = await pulled('build', buildId);
      expect(build!.record['coverPhotoId']).toBe(photo.id);
      await push(owner, [cover(null)]).expect(200);
      expect((await pulled('build', buildId))[0]!.record['coverPhotoId']).toBeNull();
    });

    it("should refuse another build's photo, an unknown one or a deleted one as cover with 422", async () => {
      const elsewhere = await addPhoto(await addBuild(client));
      const deleted = await addPhoto();
      await client.delete(`/photos/${deleted.id}`).expect(204);

      for (const coverPhotoId of [elsewhere.id, v7(), deleted.id]) {
        const refused = await client.patch(`/builds/${buildId}`, { coverPhotoId }).expect(422);
        expect(refused.body.error.code).toBe('cover_not_in_build');
      }
      const build = await client.get(`/builds/${buildId}`).expect(200);
      expect(build.body.coverPhotoId).toBeNull();
    });

    it('should refuse a cover on a new build, which has no photos yet', async () => {
      const photo = await addPhoto();

      const refused = await client
        .post('/builds', { id: v7(), name: 'Harbour', scaleRatio: 87.1, status: 'planning', coverPhotoId: photo.id })
        .expect(422);

      expect(refused.body.error.code).toBe('cover_not_in_build');
    });

    it('should clear the cover when its photo is deleted, in the same change', async () => {
      const photo = await addPhoto();
      await client.patch(`/builds/${buildId}`, { coverPhotoId: photo.id }).expect(200);

      await client.delete(`/photos/${photo.id}`).expect(204);

      const [build] = await pulled('build', buildId);
      const [tombstone] = await pulled('photo', photo.id);
      expect(build!.record['coverPhotoId']).toBeNull();
      expect(build!.changeNumber).toBe(tombstone!.changeNumber);
    });
  });

  describe('deleting what photos belong to', () => {
    it("should take a deleted build's photos with it: tombstoned, no longer served, files gone", async () => {
      const photo = await addPhoto();

      await client.delete(`/builds/${buildId}`).expect(204);

      await fetchCopy(owner, photo).expect(404);
      expect(filesKept(photo)).toEqual([false, false]);
      const [tombstone] = await pulled('photo', photo.id);
      expect(tombstone!.record.deletedAt).toEqual(jasmine.any(String));
    });

    it('should remove the files of a workshop that goes with a deleted account', async () => {
      const loner = await makeAccount(server.ctx, 'Eli');
      const own = await makeWorkshop(server.ctx, loner);
      const ownBuild = await addBuild(api(server, loner, own.id));
      const photoId = v7();
      await uploadPhoto(server, loner, own.id, photoId, { buildId: ownBuild }, { bytes: await benchJpeg() }).expect(
        201,
      );
      expect(existsSync(join(photoDir, own.id))).toBeTrue();

      await request(server.app)
        .delete('/api/account')
        .set('Cookie', loner.cookie)
        .send({ password: GOOD_PASSWORD })
        .expect(204);

      const left = existsSync(join(photoDir, own.id)) ? readdirSync(join(photoDir, own.id)) : [];
      expect(left).toEqual([]);
    });
  });
});
