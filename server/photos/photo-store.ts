import type { Readable } from 'node:stream';
import type { PhotoStoreConfig } from '../config.js';
import { diskPhotoStore } from './disk-photo-store.js';
import { s3PhotoStore } from './s3-photo-store.js';

export interface StoredCopy {
  body: Readable;
  /** When the store says. */
  bytes?: number;
}

/**
 * Where the bytes of photos live, so API processes keep none of them and any of them can serve
 * any photo. Keys are relative paths of plain names ("workshop/photo.hash.display.jpg").
 */
export interface PhotoStore {
  /** Replaces whatever the key held; a reader sees the old bytes or the new, never a part. */
  put(key: string, bytes: Buffer, contentType: string): Promise<void>;
  /** Null when nothing is stored under the key. */
  get(key: string): Promise<StoredCopy | null>;
  /** Nothing stored under the key is not an error. */
  remove(key: string): Promise<void>;
}

const SEGMENT = /^[A-Za-z0-9][A-Za-z0-9._-]*$/;

/** A key is one or more plain names joined by "/": never absolute, never "..", never a way out of the store. */
export function checkedKey(key: string): string {
  const segments = key.split('/');
  if (key.length > 512 || !segments.every((segment) => SEGMENT.test(segment) && !segment.includes('..'))) {
    throw new Error(`Not a photo store key: ${JSON.stringify(key)}`);
  }
  return key;
}

export function createPhotoStore(config: PhotoStoreConfig): PhotoStore {
  return config.kind === 'disk' ? diskPhotoStore(config.dir) : s3PhotoStore(config);
}
