import { and, eq, isNull, sql } from 'drizzle-orm';
import type * as z from 'zod';
import type { PhotoSize } from '../../shared/photo-files.js';
import type { photoPatchSchema, photoUploadFieldsSchema, PhotoRecord } from '../../shared/photo-schemas.js';
import { BUILD, STEP } from '../builds/build-service.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { builds, buildSteps, photos, pours } from '../db/schema/index.js';
import { POUR } from '../pours/pour-service.js';
import { stampChange, type Transaction } from '../records/change-stamp.js';
import {
  getRecord,
  insertRecord,
  listRecords,
  liveRecord,
  patchRecord,
  type RecordKind,
} from '../records/synced-records.js';
import { served } from '../records/served-kind.js';
import type { UnitOfWork } from '../records/unit-of-work.js';
import { authorize } from '../workshops/workshop-service.js';
import { COPY_TYPE, hashOf, makeCopies } from './photo-images.js';
import { copyKey, PHOTO, photoRecord, removeCopies, tombstonePhotos, type PhotoRow } from './photo-records.js';
import type { StoredCopy } from './photo-store.js';

type UploadFields = z.output<typeof photoUploadFieldsSchema>;
type PhotoPatch = z.output<typeof photoPatchSchema>;

/** Checked before the bytes are read in, so a stranger's upload is refused without holding it in memory. */
export async function mayUploadPhotos(ctx: ServerContext, userId: string, workshopId: string): Promise<void> {
  await authorize(ctx.db, userId, workshopId, 'write-builds');
}

/**
 * Keeps a photo uploaded under an id made on the device. The same id with the same bytes again
 * (a retry after a lost answer) changes nothing and answers the photo kept; other bytes under a
 * used id are refused. Both copies are stored before the row is written, and removed again if
 * the row is not; uploads under one id take turns, so one never removes what another keeps.
 */
export async function uploadPhoto(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  photoId: string,
  fields: UploadFields,
  bytes: Buffer | undefined,
): Promise<{ created: boolean; photo: PhotoRecord }> {
  await authorize(ctx.db, userId, workshopId, 'write-builds');
  if (!bytes || bytes.length === 0) {
    throw new AppError(400, 'photo_missing', 'Choose a photo to upload: the form has no file in the field "photo".');
  }
  const contentHash = hashOf(bytes);
  const earlier = await findPhoto(ctx.db, photoId);
  if (earlier) return { created: false, photo: sameUpload(earlier, workshopId, contentHash) };

  const copies = await makeCopies(bytes);
  const display = copyKey(workshopId, photoId, contentHash, 'display');
  const thumb = copyKey(workshopId, photoId, contentHash, 'thumb');
  const outcome = await ctx.db.transaction(async (tx) => {
    await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtextextended(${photoId}, 0))`);
    const kept = await findPhoto(tx, photoId);
    if (kept) return { created: false, row: kept };
    try {
      await ctx.photos.put(display, copies.display, COPY_TYPE);
      await ctx.photos.put(thumb, copies.thumb, COPY_TYPE);
      const changeNumber = await stampChange(tx, workshopId);
      await checkPlace(tx, workshopId, fields);
      const row = await insertRecord(tx, PHOTO, {
        ...fields,
        id: photoId,
        workshopId,
        changeNumber,
        // A time without its zone is the camera's clock: the device that read it knows the zone, the server does not.
        takenAt: copies.takenAtZoned || !fields.takenAt ? copies.takenAt : new Date(fields.takenAt),
        width: copies.width,
        height: copies.height,
        contentHash,
        displayKey: display,
        displayBytes: copies.display.length,
        thumbKey: thumb,
        thumbBytes: copies.thumb.length,
        uploadedBy: userId,
      });
      return { created: true, row };
    } catch (error) {
      await removeCopies(ctx, [display, thumb]);
      throw error;
    }
  });
  if (!outcome.created) return { created: false, photo: sameUpload(outcome.row, workshopId, contentHash) };
  return { created: true, photo: photoRecord(outcome.row) };
}

async function findPhoto(db: ServerContext['db'] | Transaction, id: string): Promise<PhotoRow | undefined> {
  const [row] = await db.select().from(photos).where(eq(photos.id, id));
  return row;
}

/** What an upload under a used id answers: the photo kept when it is the same one, a refusal otherwise. */
function sameUpload(kept: PhotoRow, workshopId: string, contentHash: string): PhotoRecord {
  if (kept.workshopId !== workshopId) {
    throw new AppError(409, 'id_taken', 'A photo with this id exists already.');
  }
  if (kept.deletedAt) {
    throw new AppError(409, 'photo_deleted', 'This photo has been deleted, so it cannot be uploaded again.');
  }
  if (kept.contentHash !== contentHash) {
    throw new AppError(
      409,
      'id_taken',
      'A different photo was uploaded under this id already; this one was not saved.',
    );
  }
  return photoRecord(kept);
}

/** A photo belongs to a live build, and at most to a live step or pour of that same build. */
async function checkPlace(tx: Transaction, workshopId: string, fields: UploadFields): Promise<void> {
  await liveRecord(tx, workshopId, BUILD, fields.buildId);
  const parts: [RecordKind<typeof buildSteps | typeof pours>, string | null | undefined][] = [
    [STEP, fields.stepId],
    [POUR, fields.pourId],
  ];
  for (const [kind, id] of parts) {
    if (!id) continue;
    const part = await liveRecord(tx, workshopId, kind, id);
    if (part['buildId'] !== fields.buildId) {
      throw new AppError(422, 'not_in_build', `This ${kind.noun} belongs to another build than the photo.`, {
        [`${kind.noun}Id`]: `Choose a ${kind.noun} of the same build`,
      });
    }
  }
}

export async function photosOfBuild(ctx: ServerContext, userId: string, workshopId: string, buildId: string) {
  await getRecord(ctx, userId, workshopId, BUILD, buildId);
  const where = and(eq(photos.buildId, buildId), isNull(photos.deletedAt));
  const rows = await listRecords(ctx, userId, workshopId, PHOTO, where);
  return rows.map(photoRecord);
}

/** One stored copy of a live photo, for a member of its workshop. */
export async function photoCopy(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  photoId: string,
  size: PhotoSize,
): Promise<StoredCopy & { contentType: string }> {
  const row = await getRecord(ctx, userId, workshopId, PHOTO, photoId);
  const copy = await ctx.photos.get(size === 'display' ? row.displayKey : row.thumbKey);
  if (!copy) {
    ctx.log.error({ photoId, size }, 'a photo is recorded but its copy is missing from the store');
    throw new AppError(404, 'not_found', 'The file of this photo is missing on the server.');
  }
  return { ...copy, contentType: COPY_TYPE };
}

export async function updatePhoto(
  { tx, workshopId, changeNumber }: UnitOfWork,
  id: string,
  patch: PhotoPatch,
): Promise<PhotoRecord> {
  return photoRecord(await patchRecord(tx, workshopId, PHOTO, id, patch, changeNumber));
}

/** A tombstone for every device; a build it was the cover of loses its cover; the copies go once that commits. */
export async function deletePhoto(
  work: UnitOfWork,
  id: string,
  photoStore: Pick<ServerContext, 'photos' | 'log'>,
): Promise<void> {
  const { tx, workshopId, changeNumber } = work;
  await liveRecord(tx, workshopId, PHOTO, id);
  await tx
    .update(builds)
    .set({ coverPhotoId: null, updatedAt: new Date(), changeNumber })
    .where(and(eq(builds.workshopId, workshopId), eq(builds.coverPhotoId, id)));
  const keys = await tombstonePhotos(tx, eq(photos.id, id), changeNumber);
  work.afterCommit(() => removeCopies(photoStore, keys));
}

/** Made by an upload; a pushed change edits or deletes one. Devices get the record without its storage keys. */
export const photoRecords = served({
  kind: 'photo',
  table: photos,
  changes: {
    patch: (work, m) => updatePhoto(work, m.recordId, m.data),
    delete: (work, m, ctx) => deletePhoto(work, m.recordId, ctx),
  },
  toRecord: (row) => ({ ...photoRecord(row) }),
});
