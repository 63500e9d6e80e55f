import { mkdtempSync, writeFileSync } from 'node:fs';
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
  const web = mkdtempSync(path.join(tmpdir(), 'laminote-web-'));
  writeFileSync(path.join(web, 'index.html'), '<!doctype html><title>Laminote</title><lam-root></lam-root>');
  writeFileSync(path.join(web, 'chunk-2LGABYPY.js'), script);
  writeFileSync(path.join(web, 'chunk--jPw_8K-.js'), script);
  writeFileSync(path.join(web, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
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

  it('keeps the chunk optimizer’s names (base 64 for URLs) a year too, and a file named without a hash asks again', async () => {
    let res = await request(t.app).get('/chunk--jPw_8K-.js').set('accept-encoding', 'gzip').expect(200);
    for (let tries = 0; tries < 50 && res.headers['transfer-encoding'] !== undefined; tries++) {
      await new Promise((resolve) => setTimeout(resolve, 20));
      res = await request(t.app).get('/chunk--jPw_8K-.js').set('accept-encoding', 'gzip').expect(200);
    }
    expect(res.headers['transfer-encoding']).toBeUndefined();
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.text).toBe(script);
    const icon = await request(t.app).get('/favicon.svg').expect(200);
    expect(icon.headers['cache-control']).toBe('no-cache');
  });

  it('answers an address of the app with index.html, asked for again every time', async () => {
    const res = await request(t.app).get('/studies/00000000-0000-4000-8000-000000000001').expect(200);
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.text).toContain('<lam-root>');
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('leaves the API alone: not compressed here, unknown routes still 404 problem+json', async () => {
    const me = await signIn(t.app, 'engineer', testEnv.publicUrl);
    const projects = await me.get('/api/projects').set('accept-encoding', 'gzip').expect(200);
    expect(projects.headers['content-encoding']).toBeUndefined();
    const missing = await me.get('/api/no-such-thing').expect(404);
    expect(missing.headers['content-type']).toMatch(/application\/problem\+json/);
  });
});
