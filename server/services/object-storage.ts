import type { Readable } from 'node:stream';
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Env } from '../env';

export interface StoredObjectInfo {
  key: string;
  sizeBytes: number;
  lastModified: Date | null;
  contentType?: string;
  etag?: string;
}

export interface StoredObjectStream {
  stream: Readable;
  sizeBytes?: number;
  contentType?: string;
}

export interface PutObjectOptions {
  contentType?: string;
  metadata?: Record<string, string>;
}

export interface ObjectStorage {
  readonly client: S3Client;
  readonly bucket: string;
  ensureBucket(): Promise<void>;
  /** Throws when the bucket cannot be reached; used by the health check. */
  checkBucket(): Promise<void>;
  putObject(key: string, body: Buffer | Uint8Array | string | Readable, options?: PutObjectOptions): Promise<void>;
  getObjectBuffer(key: string): Promise<Buffer>;
  getObjectStream(key: string): Promise<StoredObjectStream>;
  /** null when the object does not exist. */
  headObject(key: string): Promise<StoredObjectInfo | null>;
  listObjects(prefix: string): Promise<StoredObjectInfo[]>;
  deleteObject(key: string): Promise<void>;
  close(): void;
}

export type ObjectStorageSettings = Pick<
  Env,
  'S3_ENDPOINT' | 'S3_REGION' | 'S3_BUCKET' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY' | 'S3_FORCE_PATH_STYLE'
>;

function isNotFound(error: unknown): boolean {
  if (error instanceof S3ServiceException) {
    return error.$metadata.httpStatusCode === 404 || error.name === 'NotFound' || error.name === 'NoSuchKey' || error.name === 'NoSuchBucket';
  }
  return false;
}

function isReadable(body: unknown): body is Readable {
  return typeof body === 'object' && body !== null && typeof (body as Readable).pipe === 'function';
}

export function createS3Client(settings: ObjectStorageSettings): S3Client {
  return new S3Client({
    endpoint: settings.S3_ENDPOINT,
    region: settings.S3_REGION,
    forcePathStyle: settings.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: settings.S3_ACCESS_KEY_ID, secretAccessKey: settings.S3_SECRET_ACCESS_KEY },
    // Since SDK 3.729 the client adds CRC checksums by default; with a streamed
    // body it then sends aws-chunked framing, which S3-compatible stores such as
    // s3rver save verbatim: the upload "succeeds" and the object is corrupt.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
}

export function createObjectStorage(settings: ObjectStorageSettings): ObjectStorage {
  const client = createS3Client(settings);
  const bucket = settings.S3_BUCKET;

  return {
    client,
    bucket,

    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket: bucket }));
      } catch (error) {
        if (!isNotFound(error)) throw error;
        await client.send(new CreateBucketCommand({ Bucket: bucket }));
      }
    },

    async checkBucket() {
      await client.send(new HeadBucketCommand({ Bucket: bucket }));
    },

    async putObject(key, body, options = {}) {
      if (isReadable(body)) {
        // Upload handles streams of unknown length (multipart above 5 MiB).
        const upload = new Upload({
          client,
          params: { Bucket: bucket, Key: key, Body: body, ContentType: options.contentType, Metadata: options.metadata },
        });
        await upload.done();
        return;
      }
      await client.send(
        new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: options.contentType, Metadata: options.metadata }),
      );
    },

    async getObjectBuffer(key) {
      const response = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
      if (!response.Body) throw new Error(`Object storage returned no body for ${key}.`);
      return Buffer.from(await response.Body.transformToByteArray());
    },

    async getObjectStream(key) {
      const response = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
      if (!response.Body) throw new Error(`Object storage returned no body for ${key}.`);
      return { stream: response.Body as Readable, sizeBytes: response.ContentLength, contentType: response.ContentType };
    },

    async headObject(key) {
      try {
        const response = await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
        return {
          key,
          sizeBytes: response.ContentLength ?? 0,
          lastModified: response.LastModified ?? null,
          contentType: response.ContentType,
          etag: response.ETag,
        };
      } catch (error) {
        if (isNotFound(error)) return null;
        throw error;
      }
    },

    async listObjects(prefix) {
      const found: StoredObjectInfo[] = [];
      let continuationToken: string | undefined;
      do {
        const page = await client.send(
          new ListObjectsV2Command({ Bucket: bucket, Prefix: prefix, ContinuationToken: continuationToken }),
        );
        for (const item of page.Contents ?? []) {
          if (!item.Key) continue;
          found.push({ key: item.Key, sizeBytes: item.Size ?? 0, lastModified: item.LastModified ?? null, etag: item.ETag });
        }
        continuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (continuationToken);
      return found;
    },

    async deleteObject(key) {
      await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
    },

    close() {
      client.destroy();
    },
  };
}
