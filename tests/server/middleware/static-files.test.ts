import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp, HASHED_ASSET_MAX_AGE_SECONDS } from '../../../server/app';
import { createDb } from '../../../server/db/knex';
import { createLogger } from '../../../server/lib/logger';
import { createObjectStore } from '../../../server/lib/object-store';
import { testConfig } from '../support/test-app';

// A built client as Vite writes it: index.html, hashed files under assets/, and a
// stray source map that must not be served.
const dist = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-dist-'));
fs.mkdirSync(path.join(dist, 'assets'));
fs.writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Crosswatt</title><script src="/assets/index-3f9a1c.js"></script>');
const script = `export const figures = [${Array.from({ length: 4000 }, (_, i) => `"bias ${i}"`).join(',')}];\n`;
fs.writeFileSync(path.join(dist, 'assets', 'index-3f9a1c.js'), script);
fs.writeFileSync(path.join(dist, 'assets', 'index-3f9a1c.js.map'), '{"version":3,"sources":["../src/main.tsx"]}');
fs.writeFileSync(path.join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');

const config = testConfig();
const db = createDb(config.DATABASE_URL);
const app = createApp({ config, db, logger: createLogger(config), store: createObjectStore(config), clientDist: dist });
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dist, { recursive: true, force: true });
});

describe('the built client as the server sends it', () => {
  it('when a browser asks for a hashed script, then it is compressed and cached for a year as immutable', async () => {
    const res = await request(app).get('/assets/index-3f9a1c.js').set('Accept-Encoding', 'gzip');

    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toBe(`public, max-age=${HASHED_ASSET_MAX_AGE_SECONDS}, immutable`);
    expect(res.text ?? res.body.toString()).toContain('bias 3999');
  });

  it('when a browser asks for a page or an unhashed file, then it must ask again next time', async () => {
    const page = await request(app).get('/models/marrow-spider');
    const icon = await request(app).get('/favicon.svg');

    expect(page.status).toBe(200);
    expect(page.headers['cache-control']).toBe('no-cache');
    expect(icon.headers['cache-control']).toBe('no-cache');
  });

  it('when someone asks for a source map, then there is none', async () => {
    const res = await request(app).get('/assets/index-3f9a1c.js.map');

    expect(res.status).toBe(404);
    expect(res.text).not.toContain('sources');
  });
});
