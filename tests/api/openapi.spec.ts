import SwaggerParser from '@apidevtools/swagger-parser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { API_OPERATIONS } from '@laminote/contracts';
import { routeTable } from '../../server/src/http/edge';
import { openApiPath } from '../../server/src/openapi/document';
import { scopeAllows } from '../../server/src/tokens/bearer';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * The OpenAPI 3.1 description (GET /api/openapi.json) against the routes the app really mounts, both
 * ways, and against the OpenAPI 3.1 schema itself.
 */
let t: TestApp;
let viewer: SignedIn;
let document: { openapi: string; paths: Record<string, Record<string, { responses: Record<string, unknown>; 'x-token-scope': string }>>; components: { schemas: Record<string, unknown> } };

beforeAll(async () => {
  t = await createTestApp();
  viewer = await signIn(t.app, 'viewer', testEnv.publicUrl);
  document = (await viewer.get('/api/openapi.json').expect(200)).body;
});
afterAll(async () => t?.close());

describe('the OpenAPI description', () => {
  it('is a valid OpenAPI 3.1 document whose references all resolve', async () => {
    expect(document.openapi).toBe('3.1.0');
    await expect(SwaggerParser.validate(structuredClone(document) as never)).resolves.toBeTruthy();
  });

  it('describes every route the app mounts, and no route it does not', () => {
    const mounted = routeTable(t.app).map((r) => `${r.method} ${openApiPath(r.path)}`).sort();
    const described = Object.entries(document.paths).flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`)).sort();
    const missing = mounted.filter((r) => !described.includes(r));
    const stale = described.filter((r) => !mounted.includes(r));
    expect({ missing, stale }, 'add the route to API_OPERATIONS in libs/contracts/src/api-description.ts, or drop the entry').toEqual({ missing: [], stale: [] });
  });

  it('says for each route what a personal API token of each scope may do, as the server decides it', () => {
    for (const o of API_OPERATIONS) {
      if (!o.path.startsWith('/api/')) continue;
      const path = o.path.slice('/api'.length);
      const expected = scopeAllows('read', o.method, path) ? 'read' : scopeAllows('run', o.method, path) ? 'run' : 'none';
      expect(`${o.method} ${o.path}: ${o.token}`).toBe(`${o.method} ${o.path}: ${expected}`);
    }
  });

  it('carries the contracts’ schemas: a version’s detail lists its cells, a token’s creation its scope', () => {
    const detail = document.components.schemas['VersionDetail'] as { properties: Record<string, unknown>; required: string[] };
    expect(detail.required).toEqual(expect.arrayContaining(['cells', 'number', 'branchName']));
    const create = document.components.schemas['CreateToken'] as { properties: { scope: { enum: string[] } } };
    expect(create.properties.scope.enum).toEqual(['read', 'run']);
    expect(document.paths['/api/versions/{versionId}/report.pdf']!['get']!.responses['200']).toMatchObject({ content: { 'application/pdf': {} } });
  });

  it('is served to anyone signed in, and to no one else', async () => {
    const res = await (await import('supertest')).default(t.app).get('/api/openapi.json');
    expect(res.status).toBe(401);
  });
});
