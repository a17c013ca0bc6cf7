import { format } from 'date-fns';
import type { LocalPhoto, PhotoUploadRow } from '../sync/synced-records';

const WHEN = 'd MMM yyyy, HH:mm';

/** What a photo shows, for those who cannot see it: its caption, or what it is of and when. */
export function photoAlt(photo: Pick<LocalPhoto, 'caption' | 'takenAt' | 'createdAt'>, buildName: string): string {
  if (photo.caption.trim() !== '') return photo.caption;
  return photo.takenAt === null
    ? `Photo of ${buildName}, added ${format(photo.createdAt, WHEN)}`
    : `Photo of ${buildName}, taken ${format(photo.takenAt, WHEN)}`;
}

/** Where a photo's upload stands, in words, for the gallery and the list of what this device holds. */
export interface UploadStatus {
  readonly state: PhotoUploadRow['state'];
  readonly label: string;
  /** Of the bytes, while sending. */
  readonly percent: number | null;
  /** The server's refusal, or why the last try failed. */
  readonly reason: string | null;
  /**
   * A refusal that may not hold next time (a role, a membership, a build not there yet, bytes cut short on
   * the way): offered to send again. Size, type and id clashes stay as they are.
   */
  readonly mayRetry: boolean;
}

/** The app's icon for each upload state; the words beside it carry the meaning. */
export const UPLOAD_ICON = { waiting: 'timer', sending: 'sync', refused: 'caution' } as const;

const MAY_CHANGE = new Set([403, 404, 422]);

export function uploadStatus(upload: PhotoUploadRow): UploadStatus {
  const error = upload.lastError;
  switch (upload.state) {
    case 'waiting':
      return {
        state: 'waiting',
        label: 'Waiting to be sent',
        percent: null,
        reason: error === null ? null : `Last try: ${error.message}`,
        mayRetry: false,
      };
    case 'sending': {
      const percent =
        upload.bytesTotal > 0 ? Math.min(100, Math.floor((100 * upload.bytesSent) / upload.bytesTotal)) : 0;
      return { state: 'sending', label: `Sending ${percent} %`, percent, reason: null, mayRetry: false };
    }
    case 'refused':
      return {
        state: 'refused',
        label: 'Not sent',
        percent: null,
        reason: error?.message ?? 'The server refused this photo.',
        mayRetry: error !== null && MAY_CHANGE.has(error.status),
      };
  }
}

/** Why photos could not be stored, in plain words: nothing of them was kept. */
export function storeProblem(error: unknown): string {
  // Dexie passes the browser's error on as `inner` when a transaction aborts for it.
  const names = [error, (error as { inner?: unknown } | null)?.inner].map(
    (e) => (e as { name?: unknown } | null)?.name,
  );
  if (names.includes('QuotaExceededError')) {
    return (
      'This device has no room left for these photos, so none were added. ' +
      'Free some space, or let the photos waiting here be sent first.'
    );
  }
  const detail = error instanceof Error ? ` (${error.message})` : '';
  return `This device could not store the photos${detail}, so none were added. Choose them again.`;
}
