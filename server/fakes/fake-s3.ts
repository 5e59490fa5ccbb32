import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import S3rver from '@20minutes/s3rver';

export interface FakeS3 {
  /** The S3_* settings that point the app at this service and its bucket. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

/** s3rver's built-in account (its documentation); it signs nothing that leaves the machine. */
const FAKE_CREDENTIALS = { S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER' };
export const FAKE_S3_BUCKET = 'crosswatt-originals';

// A loopback S3-compatible service for npm start and the tests (s3rver: objects as
// files under `directory`). Without a directory it keeps them in a temporary folder
// removed on stop.
export async function startFakeS3(options: { host?: string; port?: number; directory?: string; bucket?: string } = {}): Promise<FakeS3> {
  const host = options.host ?? '127.0.0.1';
  const bucket = options.bucket ?? FAKE_S3_BUCKET;
  const temporary = options.directory === undefined;
  const directory = options.directory ?? fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-s3-'));
  fs.mkdirSync(directory, { recursive: true });
  const server = new S3rver({
    address: host,
    port: options.port ?? 0,
    silent: true,
    directory,
    configureBuckets: [{ name: bucket }],
    // The SDK signs a bucket's own URL with a trailing slash (`/bucket/`) and s3rver
    // checks it without one, so every bucket-level call would fail its check.
    allowMismatchedSignatures: true,
    vhostBuckets: false,
  });
  const { port } = await server.run();
  return {
    env: {
      S3_ENDPOINT: `http://${host}:${port}`,
      S3_BUCKET: bucket,
      S3_REGION: 'us-east-1',
      S3_FORCE_PATH_STYLE: 'true',
      ...FAKE_CREDENTIALS,
    },
    async stop() {
      await server.close();
      if (temporary) fs.rmSync(directory, { recursive: true, force: true });
    },
  };
}
