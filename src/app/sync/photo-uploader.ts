import {
  HttpBackend,
  HttpErrorResponse,
  HttpEventType,
  HttpRequest,
  HttpXhrBackend,
  type HttpEvent,
} from '@angular/common/http';
import { inject, Injectable, InjectionToken } from '@angular/core';
import { changeType } from '@benchtide/shared';
import { v7 } from 'uuid';
import { catchError, filter, lastValueFrom, tap, throwError, timeout, TimeoutError } from 'rxjs';
import { apiError } from '../core/api-error';
import { BenchDb } from './bench-db';
import { OfflineStore } from './offline-store';
import type { PhotoUploadRow } from './synced-records';

/**
 * How photos go up: through XMLHttpRequest, the one way a browser reports how much of an upload has gone
 * (the app's other requests use fetch, which does not).
 */
export const PHOTO_UPLOAD_BACKEND = new InjectionToken<HttpBackend>('PHOTO_UPLOAD_BACKEND', {
  providedIn: 'root',
  factory: () => inject(HttpXhrBackend),
});

/** An upload that has moved no bytes for this long has stalled: it is dropped and tried again later. */
export const UPLOAD_STALL_MS = 60_000;

/** The answers that no retry of the same bytes and fields changes: kept, shown, never sent again on their own. */
const REFUSING = new Set([400, 403, 404, 409, 413, 415, 422]);
const NOT_A_MEMBER_WORDS = 'This workshop is not open to you any more, so the photo cannot be added to it.';
/** Said when a refusal comes without the server's own words (from a proxy in front of it, say). */
const REFUSED_WORDS: Readonly<Record<number, string>> = {
  400: 'The server could not take the details sent with this photo.',
  403: 'Your role in this workshop does not let you add photos.',
  404: NOT_A_MEMBER_WORDS,
  409: 'The server already holds a different photo under this one’s id.',
  413: 'This photo is larger than the server takes.',
  415: 'The server cannot read this kind of file.',
  422: 'The server could not use this photo.',
};

/**
 * Sends a workshop's waiting photos one at a time, those tried least first, after the sync engine pushed
 * the workshop's changes (so the build, step or pour a photo belongs to is on the server first). A photo
 * goes under its own id every time, so the server answers a repeat with the photo it already holds.
 */
@Injectable({ providedIn: 'root' })
export class PhotoUploader {
  private readonly db = inject(BenchDb);
  private readonly store = inject(OfflineStore);
  private readonly backend = inject(PHOTO_UPLOAD_BACKEND);

  /**
   * Returns null when every waiting photo was sent or refused; else what stopped it (no connection, a
   * server in trouble), for the engine to try again later. Throws when the server says the session ended.
   */
  async send(workshopId: string): Promise<unknown> {
    // The engine holds the sync lock: a photo still marked as being sent was left by a tab that closed.
    await this.db.photoUploads.where('[workshopId+state]').equals([workshopId, 'sending']).modify({ state: 'waiting' });
    for (;;) {
      const waiting = await this.db.photoUploads.where('[workshopId+state]').equals([workshopId, 'waiting']).toArray();
      const next = waiting.sort(
        (a, b) => a.attempts - b.attempts || a.createdAt.localeCompare(b.createdAt) || a.id.localeCompare(b.id),
      )[0];
      if (next === undefined) return null;
      const failure = await this.sendOne(next);
      if (failure !== null) return failure;
    }
  }

  /** The account is no longer a member of the workshop: none of its waiting photos can go there. */
  async refuseAll(workshopId: string): Promise<void> {
    await this.db.photoUploads
      .where('workshopId')
      .equals(workshopId)
      .filter((row) => row.state !== 'refused')
      .modify({ state: 'refused', lastError: { code: 'not_a_member', message: NOT_A_MEMBER_WORDS, status: 404 } });
  }

  private async sendOne(row: PhotoUploadRow): Promise<unknown> {
    const sent = { ...row.fields };
    await this.db.photoUploads.update(row.id, {
      state: 'sending',
      attempts: row.attempts + 1,
      bytesSent: 0,
      bytesTotal: row.blob.size,
    });
    try {
      await this.transfer(row);
    } catch (error) {
      return this.failed(row, error);
    }
    await this.done(row, sent.caption);
    return null;
  }

  private transfer(row: PhotoUploadRow): Promise<unknown> {
    // The text fields before the file, so a form reader that streams has them when the bytes arrive.
    const body = new FormData();
    body.append('buildId', row.fields.buildId);
    body.append('stepId', row.fields.stepId ?? '');
    body.append('pourId', row.fields.pourId ?? '');
    body.append('caption', row.fields.caption);
    body.append('takenAt', row.fields.takenAt ?? '');
    body.append('photo', row.blob, row.fileName);
    const url = `/api/workshops/${row.workshopId}/photos/${row.id}`;
    const request = new HttpRequest('PUT', url, body, { reportProgress: true, withCredentials: true });
    let percent = 0;
    const events = this.backend.handle(request).pipe(
      timeout({ each: UPLOAD_STALL_MS }),
      catchError((error: unknown) =>
        throwError(() =>
          error instanceof TimeoutError ? new HttpErrorResponse({ status: 0, statusText: 'Stalled', url }) : error,
        ),
      ),
      tap((event: HttpEvent<unknown>) => {
        if (event.type !== HttpEventType.UploadProgress || !event.total) return;
        // A write per whole percent: enough to show, few enough for the device store.
        const now = Math.floor((100 * event.loaded) / event.total);
        if (now === percent) return;
        percent = now;
        void this.db.photoUploads.update(row.id, { bytesSent: event.loaded, bytesTotal: event.total });
      }),
      filter((event) => event.type === HttpEventType.Response),
    );
    return lastValueFrom(events);
  }

  /**
   * The server holds the photo: its upload row and bytes go (the pull brings the server's record). What the
   * modeller did while it was on its way follows as ordinary changes: a deletion, or a new caption.
   */
  private async done(row: PhotoUploadRow, sentCaption: string): Promise<void> {
    const { db } = this;
    await this.store.ready();
    await db.transaction('rw', [...db.syncedTables, db.outbox, db.photoUploads], async () => {
      await db.photoUploads.delete(row.id);
      const photo = await db.photos.get(row.id);
      if (photo === undefined) {
        const mutation = { type: changeType('photo', 'delete'), mutationId: v7(), recordId: row.id };
        await this.store.apply(row.workshopId, mutation, async () => []);
      } else if (photo.caption !== sentCaption) {
        await this.store.patch('photo', row.workshopId, row.id, { caption: photo.caption });
      }
    });
  }

  private async failed(row: PhotoUploadRow, error: unknown): Promise<unknown> {
    const status = error instanceof HttpErrorResponse ? error.status : 0;
    const problem = error instanceof HttpErrorResponse ? apiError(error) : null;
    const fallback = REFUSED_WORDS[status];
    const lastError = {
      code: problem?.code ?? 'failed',
      message:
        problem === null || (problem.code === 'unexpected' && fallback !== undefined)
          ? (fallback ?? 'The photo could not be sent. It will be tried again.')
          : problem.message,
      status,
    };
    const refused = REFUSING.has(status);
    // Updating a row the modeller deleted meanwhile changes nothing: the photo is not tried again.
    await this.db.photoUploads.update(row.id, { state: refused ? 'refused' : 'waiting', lastError, bytesSent: 0 });
    if (status === 401) throw error;
    return refused ? null : error;
  }
}
