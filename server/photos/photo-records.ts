import { and, eq, inArray, isNull, type SQL } from 'drizzle-orm';
import type { PhotoSize } from '../../shared/photo-files.js';
import type { PhotoRecord } from '../../shared/photo-schemas.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import type { Database } from '../db/database.js';
import { photos } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';
import type { RecordKind } from '../records/synced-records.js';

export const PHOTO: RecordKind<typeof photos> = { table: photos, noun: 'photo' };

export type PhotoRow = typeof photos.$inferSelect;

/** Where the copies of one upload are kept: by workshop, then photo and the hash of its bytes. */
export function copyKey(workshopId: string, photoId: string, contentHash: string, size: PhotoSize): string {
  return `${workshopId}/${photoId}.${contentHash}.${size}.jpg`;
}

/** A photo as devices see it: where its bytes are stored stays on the server. */
export function photoRecord(row: PhotoRow): PhotoRecord {
  return {
    id: row.id,
    workshopId: row.workshopId,
    buildId: row.buildId,
    stepId: row.stepId,
    pourId: row.pourId,
    caption: row.caption,
    takenAt: row.takenAt?.toISOString() ?? null,
    width: row.width,
    height: row.height,
    contentHash: row.contentHash,
    uploadedBy: row.uploadedBy,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    deletedAt: row.deletedAt?.toISOString() ?? null,
    changeNumber: row.changeNumber,
  };
}

/** Tombstones the live photos that match, with the change number of the write; answers the keys of their copies. */
export async function tombstonePhotos(tx: Transaction, where: SQL, changeNumber: number): Promise<string[]> {
  const now = new Date();
  const gone = await tx
    .update(photos)
    .set({ deletedAt: now, updatedAt: now, changeNumber })
    .where(and(where, isNull(photos.deletedAt)))
    .returning({ displayKey: photos.displayKey, thumbKey: photos.thumbKey });
  return gone.flatMap((photo) => [photo.displayKey, photo.thumbKey]);
}

/** The keys of every copy the workshops' photos keep, deleted ones too, for when the workshops themselves go. */
export async function copyKeysOf(db: Database | Transaction, workshopIds: readonly string[]): Promise<string[]> {
  if (workshopIds.length === 0) return [];
  const rows = await db
    .select({ displayKey: photos.displayKey, thumbKey: photos.thumbKey })
    .from(photos)
    .where(inArray(photos.workshopId, workshopIds));
  return rows.flatMap((photo) => [photo.displayKey, photo.thumbKey]);
}

/**
 * Removes stored copies no record needs any more. A copy that cannot be removed now is left
 * behind and logged: the write it follows has committed and stands.
 */
export async function removeCopies(ctx: Pick<ServerContext, 'photos' | 'log'>, keys: readonly string[]): Promise<void> {
  for (const key of keys) {
    try {
      await ctx.photos.remove(key);
    } catch (error) {
      ctx.log.warn({ err: error, key }, 'a photo copy could not be removed');
    }
  }
}

/** A build's cover must be a live photo of that very build. */
export async function checkCover(tx: Transaction, workshopId: string, buildId: string, photoId: string) {
  const [photo] = await tx
    .select({ id: photos.id })
    .from(photos)
    .where(
      and(
        eq(photos.id, photoId),
        eq(photos.workshopId, workshopId),
        eq(photos.buildId, buildId),
        isNull(photos.deletedAt),
      ),
    );
  if (!photo) {
    throw new AppError(
      422,
      'cover_not_in_build',
      'Only a photo of this build can be its cover, and this one is not, or has been deleted.',
      {
        coverPhotoId: 'Choose one of the photos of this build',
      },
    );
  }
}
