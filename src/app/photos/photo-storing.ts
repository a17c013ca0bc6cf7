import { signal } from '@angular/core';
import type { BuildPhoto } from './build-photos';
import { photoAlt, storeProblem, uploadStatus } from './photo-words';

/**
 * Photos being stored on the device for a screen: how many are on their way, and why they could not
 * be stored, in plain words. Nothing is kept of photos that could not be stored.
 */
export class PhotoStoring {
  readonly saving = signal(0);
  readonly problem = signal<string | null>(null);

  /** Runs `store` for `count` photos; says whether they were stored. */
  async store(count: number, store: () => Promise<unknown>): Promise<boolean> {
    this.problem.set(null);
    this.saving.set(count);
    try {
      await store();
      return true;
    } catch (error) {
      this.problem.set(storeProblem(error));
      return false;
    } finally {
      this.saving.set(0);
    }
  }
}

/** A photo as a tile shows it: described for screen readers, with where its upload stands. */
export function photoTile(entry: BuildPhoto, buildName: string) {
  return {
    ...entry,
    alt: photoAlt(entry.photo, buildName),
    status: entry.upload ? uploadStatus(entry.upload) : null,
  };
}
