import { referenceEntries } from './api-reference-page';
import type { OpenApiDocument } from './api-reference-api';

describe('API reference entries', () => {
  const doc: OpenApiDocument = {
    openapi: '3.1.0',
    info: { title: 'Laminote API', version: '1', description: '' },
    tags: [{ name: 'Reports' }, { name: 'API tokens' }, { name: 'Unused' }],
    paths: {
      '/api/versions/{versionId}/report.pdf': {
        get: {
          summary: 'PDF',
          tags: ['Reports'],
          parameters: [{ name: 'versionId', in: 'path', required: true, schema: { type: 'string' } }],
          responses: { '200': { description: 'pdf', content: { 'application/pdf': {} } }, '404': { description: 'no' } },
          'x-token-scope': 'read',
        },
      },
      '/api/me/tokens': {
        post: {
          summary: 'Make a token',
          tags: ['API tokens'],
          requestBody: { content: { 'application/json': { schema: { $ref: '#/components/schemas/CreateToken' } } } },
          responses: { '201': { description: 'made', content: { 'application/json': { schema: { $ref: '#/components/schemas/CreatedToken' } } } } },
          'x-token-scope': 'none',
        },
      },
    },
    components: { schemas: {} },
  };

  it('groups routes by their tag, in the document’s tag order, leaving out empty tags', () => {
    const groups = referenceEntries(doc);
    expect(groups.map((g) => g.tag)).toEqual(['Reports', 'API tokens']);
  });

  it('reads the success answer, the body’s schema name and the token scope of each route', () => {
    const [reports, tokens] = referenceEntries(doc);
    expect(reports!.entries[0]).toMatchObject({ method: 'GET', status: '200', answer: { contentType: 'application/pdf', schema: null }, scope: 'read', parameters: [{ name: 'versionId', where: 'path', required: true }] });
    expect(tokens!.entries[0]).toMatchObject({ method: 'POST', status: '201', body: { schema: 'CreateToken' }, answer: { schema: 'CreatedToken' }, scope: 'none' });
  });
});
