import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { signIn } from '../support/sign-in';

/**
 * The built web app as the server sends it (issue 15, cold opens): ahead of the session, compressed,
 * its content-hashed files kept by browsers for a year, index.html asked for every time; the API and
 * its answers untouched by any of it.
 */

let t: TestApp;
const script = `export const laminote = ${JSON.stringify('x'.repeat(4000))};\n`;

beforeAll(async () => {
  // As the production build lays it out: the app in browser/, the build's record of its chunks beside it.
  const dist = mkdtempSync(path.join(tmpdir(), 'laminote-web-'));
  const web = path.join(dist, 'browser');
  mkdirSync(web);
  writeFileSync(path.join(web, 'index.html'), '<!doctype html><head><title>Laminote</title><link rel="modulepreload" href="chunk-SHAREDAA.js"></head><body><lam-root></lam-root><script src="main-AAAAAAAA.js" type="module"></script></body>');
  writeFileSync(path.join(web, 'chunk-2LGABYPY.js'), script);
  const stats = {
    outputs: {
      'main-AAAAAAAA.js': { entryPoint: 'apps/web/src/main.ts', imports: [{ path: 'chunk-SHAREDAA.js', kind: 'import-statement' }, { path: 'chunk-NOTEBOOK.js', kind: 'dynamic-import' }] },
      'chunk-SHAREDAA.js': { imports: [] },
      'chunk-NOTEBOOK.js': { entryPoint: 'apps/web/src/app/notebook/notebook-page.ts', imports: [{ path: 'chunk-SHAREDAA.js', kind: 'import-statement' }, { path: 'chunk-DEEPERAA.js', kind: 'import-statement' }, { path: 'chunk-PLOTTING.js', kind: 'dynamic-import' }] },
      'chunk-DEEPERAA.js': { imports: [{ path: 'chunk-DEEPEST1.js', kind: 'import-statement' }] },
      'chunk-DEEPEST1.js': { imports: [] },
      'chunk-FLOWBODY.js': { entryPoint: 'apps/web/src/app/notebook/flow/flow-cell.ts', imports: [{ path: 'chunk-DEEPEST1.js', kind: 'import-statement' }] },
      'chunk-PLOTTING.js': { entryPoint: 'apps/web/src/app/shared/plot.ts', imports: [] },
      'chunk-PROJECTS.js': { entryPoint: 'apps/web/src/app/projects/project-list.ts', imports: [] },
    },
  };
  writeFileSync(path.join(dist, 'stats.json'), JSON.stringify(stats));
  t = await createTestApp({ WEB_DIST: web }, { worker: false });
});
afterAll(async () => t?.close());

describe('the web app’s files', () => {
  it('sends a content-hashed file compressed, to be kept a year, without touching the session', async () => {
    const res = await request(t.app).get('/chunk-2LGABYPY.js').set('accept-encoding', 'gzip').expect(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.text).toBe(script);
    expect(res.headers['set-cookie']).toBeUndefined();
    // The security headers still come with it.
    expect(res.headers['content-security-policy']).toContain("script-src 'self'");
  });

  it('compresses a content-hashed file once and then sends it from memory, the same bytes and headers', async () => {
    const first = await request(t.app).get('/chunk-2LGABYPY.js').set('accept-encoding', 'br, gzip').expect(200);
    // Until the stored copy is ready the file goes out compressed on the fly; after that from memory.
    let stored = first;
    for (let tries = 0; tries < 50; tries++) {
      stored = await request(t.app).get('/chunk-2LGABYPY.js').set('accept-encoding', 'br, gzip').expect(200);
      if (stored.headers['transfer-encoding'] === undefined) break;
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    expect(stored.headers['transfer-encoding']).toBeUndefined();
    for (const res of [first, stored]) {
      expect(res.headers['content-encoding']).toBe('br');
      expect(res.headers['content-type']).toMatch(/^text\/javascript|^application\/javascript/);
      expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
      expect(res.headers['vary']).toMatch(/accept-encoding/i);
      expect(res.text).toBe(script);
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    const gzipped = await request(t.app).get('/chunk-2LGABYPY.js').set('accept-encoding', 'gzip').expect(200);
    expect(gzipped.headers['content-encoding']).toBe('gzip');
    expect(gzipped.text).toBe(script);
  });

  it('answers an address of the app with index.html, asked for again every time', async () => {
    const res = await request(t.app).get('/studies/00000000-0000-4000-8000-000000000001').expect(200);
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.text).toContain('<lam-root>');
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('names the notebook’s code on a study’s address, so it comes in one round, and only there', async () => {
    const study = await request(t.app).get('/studies/00000000-0000-4000-8000-000000000001').expect(200);
    expect(study.headers['content-type']).toMatch(/^text\/html/);
    const preloaded = [...study.text.matchAll(/<link rel="modulepreload" href="([^"]+)" fetchpriority="low">/g)].map((m) => m[1]);
    // The page, every level of its static imports and each cell body; not the plots (imported when
    // drawn), not another page, not what index.html already names.
    expect(preloaded.sort()).toEqual(['chunk-DEEPERAA.js', 'chunk-DEEPEST1.js', 'chunk-FLOWBODY.js', 'chunk-NOTEBOOK.js']);
    expect(study.text.split('chunk-SHAREDAA.js').length - 1).toBe(1);
    // After the app's entry, so the entry and the first reads are not queued behind them.
    expect(study.text.indexOf('fetchpriority="low"')).toBeGreaterThan(study.text.indexOf('main-AAAAAAAA.js'));
    expect(study.text).toContain('<lam-root>');
    const list = await request(t.app).get('/studies').expect(200);
    expect(list.text).not.toContain('chunk-NOTEBOOK.js');
  });

  it('leaves the API alone: not compressed here, unknown routes still 404 problem+json', async () => {
    const me = await signIn(t.app, 'engineer', testEnv.publicUrl);
    const projects = await me.get('/api/projects').set('accept-encoding', 'gzip').expect(200);
    expect(projects.headers['content-encoding']).toBeUndefined();
    const missing = await me.get('/api/no-such-thing').expect(404);
    expect(missing.headers['content-type']).toMatch(/application\/problem\+json/);
  });
});
