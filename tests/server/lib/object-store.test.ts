import { describe, expect, it } from 'vitest';
import { freePort } from '../../../scripts/lib/port';
import { createObjectStore, ObjectStoreError } from '../../../server/lib/object-store';
import { testObjectStore, testObjectStoreEnv } from '../../support/test-object-store';
import { testConfig } from '../support/test-app';

// Against this file's bucket in the run's fake S3 service, through the SDK's path-style requests.
const store = testObjectStore();

describe('the object store', () => {
  it('when an object is written, then it reads back byte for byte, heads, lists and counts; when deleted, it is gone', async () => {
    const body = new Uint8Array([0x0e, 0x20, 0x2e, 0x46, 0x49, 0x54, 0, 255, 7]);

    await store.put('lifecycle/ab/one.fit', body);

    expect(await store.get('lifecycle/ab/one.fit')).toEqual(body);
    expect(await store.head('lifecycle/ab/one.fit')).toMatchObject({ key: 'lifecycle/ab/one.fit', bytes: body.length });
    const listed = [];
    for await (const object of store.list('lifecycle/')) listed.push(object.key);
    expect(listed).toEqual(['lifecycle/ab/one.fit']);
    expect(await store.size('lifecycle/')).toEqual({ objects: 1, bytes: body.length });
    await store.delete('lifecycle/ab/one.fit');
    expect(await store.get('lifecycle/ab/one.fit')).toBeUndefined();
    expect(await store.size('lifecycle/')).toEqual({ objects: 0, bytes: 0 });
  });

  it('when a key was never written, then reading and heading it answer nothing and deleting it is no error', async () => {
    expect(await store.get('missing/key.fit')).toBeUndefined();
    expect(await store.head('missing/key.fit')).toBeUndefined();
    await expect(store.delete('missing/key.fit')).resolves.toBeUndefined();
  });

  it('when objects lie under several prefixes, then size counts only those under the one asked for', async () => {
    await store.put('count/a/1.fit', new Uint8Array(10));
    await store.put('count/b/2.fit', new Uint8Array(32));
    await store.put('elsewhere/3.fit', new Uint8Array(5));

    expect(await store.size('count/')).toEqual({ objects: 2, bytes: 42 });
  });

  it('when the bucket does not exist yet, then ensureBucket makes it and writes work', async () => {
    const fresh = createObjectStore(testConfig({ ...testObjectStoreEnv(), S3_BUCKET: `fresh-${process.pid}-${Date.now()}` }));

    await fresh.ensureBucket();
    await fresh.put('k.fit', new Uint8Array([1]));

    expect(await fresh.get('k.fit')).toEqual(new Uint8Array([1]));
    fresh.close();
  });

  it('when nothing answers at the endpoint, then every operation fails with an ObjectStoreError', async () => {
    const down = createObjectStore(testConfig({ ...testObjectStoreEnv(), S3_ENDPOINT: `http://127.0.0.1:${await freePort()}` }));

    await expect(down.put('k.fit', new Uint8Array([1]))).rejects.toBeInstanceOf(ObjectStoreError);
    await expect(down.get('k.fit')).rejects.toBeInstanceOf(ObjectStoreError);
    await expect(down.head('k.fit')).rejects.toBeInstanceOf(ObjectStoreError);
    await expect(down.delete('k.fit')).rejects.toBeInstanceOf(ObjectStoreError);
    await expect(down.size('')).rejects.toBeInstanceOf(ObjectStoreError);
    down.close();
  });
});
