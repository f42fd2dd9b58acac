/**
 * Where photo bytes live: S3-compatible object storage through the AWS SDK (the local s3rver fake
 * under `npm start` and the tests, real object storage in production), behind a small interface so
 * tests and other backends can stand in.
 */
import type { Readable } from 'node:stream';
import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { Config } from '../config';

export interface StoredObject {
  body: Readable;
  contentType?: string;
  contentLength?: number;
}

export interface PhotoStorage {
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  /** The object, or null when there is none under this key. */
  get(key: string): Promise<StoredObject | null>;
  delete(key: string): Promise<void>;
}

export function createS3PhotoStorage(config: Config): PhotoStorage {
  const client = new S3Client({
    endpoint: config.S3_ENDPOINT,
    region: config.S3_REGION,
    forcePathStyle: true,
    credentials: { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY },
  });
  const Bucket = config.S3_BUCKET;
  return {
    async put(key, body, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }));
    },
    async get(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        if (!out.Body) return null;
        return { body: out.Body as Readable, contentType: out.ContentType, contentLength: out.ContentLength };
      } catch (err) {
        if (err instanceof NoSuchKey || (err as { name?: string }).name === 'NoSuchKey') return null;
        throw err;
      }
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
  };
}
