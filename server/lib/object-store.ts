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
import type { Config } from '../config/env';

// Objects through the S3 API: one bucket, any S3-compatible store (production's,
// or the fake that npm start and the tests run on loopback). Callers choose the
// keys; this module only moves bytes and answers what is there.

export interface StoredObject {
  key: string;
  bytes: number;
  lastModified: Date;
}

export interface ObjectStore {
  readonly bucket: string;
  put(key: string, body: Uint8Array, contentType?: string): Promise<void>;
  /** The object's bytes, or undefined when there is no such object. */
  get(key: string): Promise<Uint8Array | undefined>;
  /** Size and age without the bytes, or undefined when there is no such object. */
  head(key: string): Promise<StoredObject | undefined>;
  /** Deleting a missing object is not an error (S3 answers the same). */
  delete(key: string): Promise<void>;
  /** Every object under a prefix, a page of up to 1,000 at a time. */
  list(prefix: string): AsyncGenerator<StoredObject>;
  /** Object count and bytes under a prefix. */
  size(prefix: string): Promise<{ objects: number; bytes: number }>;
  /** Creates the bucket when it is missing (the fakes and the tests; production's exists already). */
  ensureBucket(): Promise<void>;
  close(): void;
}

/** The store could not be reached or refused the request: the caller decides what that means for its work. */
export class ObjectStoreError extends Error {
  constructor(operation: string, key: string, cause: unknown) {
    super(`object store ${operation} of ${key} failed: ${cause instanceof Error ? cause.message : String(cause)}`, { cause });
    this.name = 'ObjectStoreError';
  }
}

export function createObjectStore(
  config: Pick<Config, 'S3_ENDPOINT' | 'S3_BUCKET' | 'S3_REGION' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY' | 'S3_FORCE_PATH_STYLE'>,
): ObjectStore {
  const bucket = config.S3_BUCKET;
  const client = new S3Client({
    endpoint: config.S3_ENDPOINT,
    region: config.S3_REGION,
    forcePathStyle: config.S3_FORCE_PATH_STYLE,
    credentials:
      config.S3_ACCESS_KEY_ID && config.S3_SECRET_ACCESS_KEY
        ? { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY }
        : undefined,
    // Checksums only where the API requires them: S3-compatible stores other than
    // AWS's own do not all know the SDK's newer default checksum headers (common practice).
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    // An upload waits for its write: a store that is down must answer quickly.
    maxAttempts: 2,
    requestHandler: { connectionTimeout: 3_000, requestTimeout: 30_000 },
  });

  async function attempt<T>(operation: string, key: string, run: () => Promise<T>): Promise<T> {
    try {
      return await run();
    } catch (err) {
      throw new ObjectStoreError(operation, key, err);
    }
  }

  const isMissing = (err: unknown) =>
    err instanceof S3ServiceException && (err.name === 'NoSuchKey' || err.name === 'NotFound' || err.$metadata.httpStatusCode === 404);

  async function* list(prefix: string): AsyncGenerator<StoredObject> {
    let continuationToken: string | undefined;
    do {
      const page = await attempt('list', prefix, () =>
        client.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: prefix, ContinuationToken: continuationToken })),
      );
      for (const item of page.Contents ?? []) {
        if (item.Key) yield { key: item.Key, bytes: item.Size ?? 0, lastModified: item.LastModified ?? new Date(0) };
      }
      continuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (continuationToken);
  }

  return {
    bucket,
    async put(key, body, contentType = 'application/octet-stream') {
      await attempt('write', key, () =>
        client.send(
          new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.byteLength }),
        ),
      );
    },
    async get(key) {
      try {
        const object = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
        return object.Body ? await object.Body.transformToByteArray() : new Uint8Array();
      } catch (err) {
        if (isMissing(err)) return undefined;
        throw new ObjectStoreError('read', key, err);
      }
    },
    async head(key) {
      try {
        const object = await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
        return { key, bytes: object.ContentLength ?? 0, lastModified: object.LastModified ?? new Date(0) };
      } catch (err) {
        if (isMissing(err)) return undefined;
        throw new ObjectStoreError('head', key, err);
      }
    },
    async delete(key) {
      await attempt('delete', key, () => client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key })));
    },
    list,
    async size(prefix) {
      let objects = 0;
      let bytes = 0;
      for await (const object of list(prefix)) {
        objects++;
        bytes += object.bytes;
      }
      return { objects, bytes };
    },
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket: bucket }));
      } catch (err) {
        if (!isMissing(err)) throw new ObjectStoreError('head', bucket, err);
        await attempt('create', bucket, () => client.send(new CreateBucketCommand({ Bucket: bucket })));
      }
    },
    close: () => client.destroy(),
  };
}
