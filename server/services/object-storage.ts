import type { Readable } from 'node:stream';
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  DeleteObjectsCommand,
  ListObjectsCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Env } from '../env';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';

export const OBJECT_STORAGE_UNAVAILABLE_MESSAGE = 'Object storage cannot be reached just now; nothing was changed. Please try again in a minute.';

const NETWORK_FAILURE_CODES = /^(ECONNREFUSED|ECONNRESET|ECONNABORTED|EPIPE|ETIMEDOUT|EHOSTUNREACH|ENETUNREACH|ENOTFOUND|EAI_AGAIN)$/;

/** True when the store could not be reached at all (as opposed to answering with an error). */
export function isObjectStorageUnreachable(error: unknown): boolean {
  for (let current = error, depth = 0; current instanceof Error && depth < 5; current = current.cause, depth++) {
    const code = (current as { code?: unknown }).code;
    if (typeof code === 'string' && NETWORK_FAILURE_CODES.test(code)) return true;
    if (current.name === 'TimeoutError' || /^socket hang up$/i.test(current.message)) return true;
  }
  return false;
}

/** Runs a storage call, turning "cannot connect" into a 503 with a sentence; other errors pass unchanged. */
async function reachable<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (isObjectStorageUnreachable(error)) {
      const unavailable = new HttpError(HttpStatus.SERVICE_UNAVAILABLE, OBJECT_STORAGE_UNAVAILABLE_MESSAGE);
      unavailable.cause = error;
      throw unavailable;
    }
    throw error;
  }
}

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

export interface DeleteObjectsOutcome {
  deleted: string[];
  failed: { key: string; message: string }[];
}

/** S3's limit on the keys of one DeleteObjects request. */
const DELETE_OBJECTS_BATCH = 1000;

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
  /** The objects under `prefix` one listing page at a time (at most 1000 each), in key order, so a whole bucket never sits in memory. */
  listObjectPages(prefix: string): AsyncGenerator<StoredObjectInfo[]>;
  /** Deletes many keys with DeleteObjects (1000 per call); a key that did not exist counts as deleted, as in S3. */
  deleteObjects(keys: readonly string[]): Promise<DeleteObjectsOutcome>;
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

  async function putObjectOnce(key: string, body: Buffer | Uint8Array | string | Readable, options: PutObjectOptions): Promise<void> {
    if (isReadable(body)) {
      // Upload handles streams of unknown length (multipart above 5 MiB).
      const upload = new Upload({
        client,
        params: { Bucket: bucket, Key: key, Body: body, ContentType: options.contentType, Metadata: options.metadata },
      });
      await upload.done();
      return;
    }
    await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: options.contentType, Metadata: options.metadata }));
  }

  async function headObjectOnce(key: string): Promise<StoredObjectInfo | null> {
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
  }

  async function* objectPages(prefix: string): AsyncGenerator<StoredObjectInfo[]> {
    // ListObjects (v1) with Marker = the last key seen, not v2's continuation token:
    // s3rver 3.7 makes its v2 tokens with DES, which OpenSSL 3 (Node 18+) lacks, so
    // every truncated v2 listing there fails with InternalError. Real S3 serves both.
    let marker: string | undefined;
    for (;;) {
      const page = await reachable(() => client.send(new ListObjectsCommand({ Bucket: bucket, Prefix: prefix || undefined, Marker: marker })));
      const items: StoredObjectInfo[] = [];
      for (const item of page.Contents ?? []) {
        if (!item.Key) continue;
        items.push({ key: item.Key, sizeBytes: item.Size ?? 0, lastModified: item.LastModified ?? null, etag: item.ETag });
      }
      if (items.length > 0) yield items;
      if (!page.IsTruncated || items.length === 0) return;
      marker = page.NextMarker ?? items[items.length - 1].key;
    }
  }

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

    putObject(key, body, options = {}) {
      return reachable(() => putObjectOnce(key, body, options));
    },

    getObjectBuffer(key) {
      return reachable(async () => {
        const response = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
        if (!response.Body) throw new Error(`Object storage returned no body for ${key}.`);
        return Buffer.from(await response.Body.transformToByteArray());
      });
    },

    getObjectStream(key) {
      return reachable(async () => {
        const response = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
        if (!response.Body) throw new Error(`Object storage returned no body for ${key}.`);
        return { stream: response.Body as Readable, sizeBytes: response.ContentLength, contentType: response.ContentType };
      });
    },

    headObject(key) {
      return reachable(() => headObjectOnce(key));
    },

    async listObjects(prefix) {
      const found: StoredObjectInfo[] = [];
      for await (const page of objectPages(prefix)) found.push(...page);
      return found;
    },

    listObjectPages: objectPages,

    async deleteObjects(keys) {
      const outcome: DeleteObjectsOutcome = { deleted: [], failed: [] };
      for (let start = 0; start < keys.length; start += DELETE_OBJECTS_BATCH) {
        const batch = keys.slice(start, start + DELETE_OBJECTS_BATCH);
        try {
          const response = await client.send(
            new DeleteObjectsCommand({ Bucket: bucket, Delete: { Objects: batch.map((key) => ({ Key: key })), Quiet: false } }),
          );
          const failedKeys = new Set<string>();
          for (const error of response.Errors ?? []) {
            if (!error.Key) continue;
            failedKeys.add(error.Key);
            outcome.failed.push({ key: error.Key, message: error.Message ?? error.Code ?? 'Object storage refused the delete.' });
          }
          // Only keys the store confirmed count as deleted; one it neither confirmed nor refused is not assumed gone.
          const confirmed = new Set((response.Deleted ?? []).map((item) => item.Key).filter((key): key is string => Boolean(key)));
          for (const key of batch) {
            if (failedKeys.has(key)) continue;
            if (confirmed.has(key)) outcome.deleted.push(key);
            else outcome.failed.push({ key, message: 'Object storage did not confirm the delete.' });
          }
        } catch (error) {
          // Reported per key, not thrown: the caller keeps what earlier batches deleted.
          const message = isObjectStorageUnreachable(error) ? OBJECT_STORAGE_UNAVAILABLE_MESSAGE : error instanceof Error ? error.message : String(error);
          for (const key of batch) outcome.failed.push({ key, message });
        }
      }
      return outcome;
    },

    deleteObject(key) {
      return reachable(async () => {
        await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
      });
    },

    close() {
      client.destroy();
    },
  };
}
