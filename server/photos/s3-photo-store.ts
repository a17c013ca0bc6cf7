import {
  DeleteObjectCommand,
  GetObjectCommand,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import type { PhotoStoreConfig } from '../config.js';
import { checkedKey, type PhotoStore } from './photo-store.js';

/** Photos as objects in a bucket of AWS S3 or any service that speaks its API (MinIO, Ceph, R2...). */
export function s3PhotoStore(config: Extract<PhotoStoreConfig, { kind: 's3' }>): PhotoStore {
  const client = new S3Client({
    region: config.region,
    endpoint: config.endpoint,
    forcePathStyle: config.forcePathStyle,
    credentials: config.credentials,
    // Only what the S3 API requires: many compatible services refuse the newer default checksums.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = config.bucket;

  return {
    async put(key, bytes, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: checkedKey(key), Body: bytes, ContentType: contentType }));
    },

    async get(key) {
      try {
        const answer = await client.send(new GetObjectCommand({ Bucket, Key: checkedKey(key) }));
        return { body: answer.Body as Readable, bytes: answer.ContentLength };
      } catch (error) {
        if (error instanceof NoSuchKey) return null;
        if (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 404) return null;
        throw error;
      }
    },

    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: checkedKey(key) }));
    },
  };
}
