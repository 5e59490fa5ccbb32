import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../../server/config/env';

const base = { DATABASE_URL: 'postgres://crosswatt@127.0.0.1:5432/crosswatt' };

describe('configuration', () => {
  it('when a value is malformed, then the process refuses to start with a message naming the setting', () => {
    expect(() => loadConfig({ ...base, PORT: 'eighty' })).toThrow(ConfigError);
    expect(() => loadConfig({ ...base, PORT: 'eighty' })).toThrow(/PORT/);
    expect(() => loadConfig({ DATABASE_URL: 'mysql://nope' })).toThrow(/DATABASE_URL: must be a postgres:\/\/ URL/);
  });

  it('when production runs without its own session secret, then it refuses to start', () => {
    expect(() => loadConfig({ ...base, NODE_ENV: 'production' })).toThrow(/SESSION_SECRET must be set in production/);
  });

  it('when production is pointed at the local stand-in sign-in service, then it refuses to start', () => {
    const production = { ...base, NODE_ENV: 'production', SESSION_SECRET: 'a-real-secret-of-enough-length' };

    expect(() => loadConfig({ ...production, OAUTH_FAKE: 'true' })).toThrow(/OAUTH_FAKE/);
    expect(loadConfig(production).OAUTH_FAKE).toBe(false);
  });

  it('when only one of the two S3 credentials is set, or the bucket name is not one S3 allows, then it refuses to start', () => {
    expect(() => loadConfig({ ...base, S3_ACCESS_KEY_ID: 'key-only' })).toThrow(/S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY/);
    expect(() => loadConfig({ ...base, S3_BUCKET: 'Originals_Bucket' })).toThrow(/S3_BUCKET/);
    expect(loadConfig({ ...base, S3_FORCE_PATH_STYLE: 'true', S3_ENDPOINT: 'http://127.0.0.1:9000' })).toMatchObject({
      S3_FORCE_PATH_STYLE: true,
      ORIGINALS_SWEEP_GRACE_HOURS: 24,
    });
  });
});
