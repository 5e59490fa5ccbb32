import { loadConfig } from '../../server/config/env';
import { createObjectStore, type ObjectStore } from '../../server/lib/object-store';

/** The S3_* settings of this test file's bucket in the run's fake S3 service (tests/server/setup-database.ts). */
export function testObjectStoreEnv(): Record<string, string> {
  return Object.fromEntries(
    Object.entries(process.env).filter((entry): entry is [string, string] => entry[0].startsWith('S3_') && entry[1] !== undefined),
  );
}

let store: ObjectStore | undefined;

/** A client of this test file's bucket, for arranging uploads through the services. */
export function testObjectStore(): ObjectStore {
  store ??= createObjectStore(loadConfig({ DATABASE_URL: process.env.DATABASE_URL, ...testObjectStoreEnv() }));
  return store;
}
