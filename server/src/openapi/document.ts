import { z } from 'zod';
import { API_OPERATIONS, PROBLEM_SCHEMA, type ApiOperation, type NamedSchema, type OtherContent } from '@laminote/contracts';
import { ENGINE_CAUTION, ENGINE_VERSION } from '@laminote/aero';

/**
 * The OpenAPI 3.1 document, made from the API description in libs/contracts: every JSON body and
 * answer is the contract's own zod schema turned into JSON Schema (2020-12, OpenAPI 3.1's dialect) by
 * zod itself, so the description cannot drift from what the server validates.
 */
type JsonSchema = Record<string, unknown>;

const isNamed = (x: NamedSchema | OtherContent): x is NamedSchema => 'schema' in x;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const out = z.toJSONSchema(schema, { target: 'draft-2020-12', io, unrepresentable: 'any' }) as JsonSchema;
  delete out['$schema'];
  return out;
}

/** `/api/versions/:versionId` → `/api/versions/{versionId}` */
export function openApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z_]\w*)/g, '{$1}');
}

export function buildOpenApiDocument(publicUrl: string, operations: readonly ApiOperation[] = API_OPERATIONS) {
  const schemas: Record<string, JsonSchema> = {};
  const ref = (named: NamedSchema, io: 'input' | 'output') => {
    schemas[named.name] ??= jsonSchema(named.schema, io);
    return { $ref: `#/components/schemas/${named.name}` };
  };
  const problem = { 'application/problem+json': { schema: ref(PROBLEM_SCHEMA, 'output') } };
  const paths: Record<string, Record<string, unknown>> = {};
  for (const o of operations) {
    const path = openApiPath(o.path);
    const params = [...o.path.matchAll(/:([A-Za-z_]\w*)/g)].map((m) => ({
      name: m[1],
      in: 'path',
      required: true,
      schema: m[1]!.endsWith('Id') ? { type: 'string', format: 'uuid' } : { type: 'string' },
    }));
    if (o.query) {
      const query = jsonSchema(o.query.schema, 'input') as { properties?: Record<string, JsonSchema>; required?: string[] };
      for (const [name, schema] of Object.entries(query.properties ?? {})) params.push({ name, in: 'query', required: query.required?.includes(name) ?? false, schema } as never);
    }
    const responses: Record<string, unknown> = {
      [String(o.status)]: o.response
        ? { description: isNamed(o.response) ? o.response.name : o.response.description, content: isNamed(o.response) ? { 'application/json': { schema: ref(o.response, 'output') } } : { [o.response.contentType]: {} } }
        : { description: 'Done; no body.' },
      ...(o.accepted ? { '202': { description: `${o.accepted.name}: the work goes on as a job`, content: { 'application/json': { schema: ref(o.accepted, 'output') } } } } : {}),
      '400': { description: 'Bad input: the field (or table line) at fault is named.', content: problem },
      '401': { description: 'Not signed in, or the API token is unknown, revoked or expired.', content: problem },
      '403': { description: 'The caller’s role, or the token’s scope, does not allow this.', content: problem },
      '404': { description: 'Not found, or in a project the caller is not a member of.', content: problem },
    };
    if (o.token !== 'none') responses['429'] = { description: 'Too many requests with this API token.', content: problem };
    const operation: Record<string, unknown> = {
      operationId: `${o.method.toLowerCase()}${path.replace(/[{}]/g, '').replace(/[^A-Za-z0-9]+(\w)/g, (_m, c: string) => c.toUpperCase())}`,
      tags: [o.tag],
      summary: o.summary,
      ...(params.length ? { parameters: params } : {}),
      ...(o.body
        ? { requestBody: { required: true, content: isNamed(o.body) ? { 'application/json': { schema: ref(o.body, 'input') } } : { [o.body.contentType]: { schema: { type: 'object', description: o.body.description } } } } }
        : {}),
      responses,
      security: o.token === 'none' ? [{ session: [] }] : [{ session: [] }, { token: [o.token] }],
      'x-token-scope': o.token,
    };
    (paths[path] ??= {})[o.method.toLowerCase()] = operation;
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Laminote API',
      version: ENGINE_VERSION,
      description:
        'The API of Laminote, the study notebook for natural-laminar-flow design. Sign in through the app (a session cookie, with the anti-forgery header on changes) or send a personal API token as `Authorization: Bearer …` (made under Settings → API tokens; scope `read`, or `run` for draft edits, uploads and runs). Every route checks the caller’s role in the project; a project the caller is not in answers 404. Errors are application/problem+json (RFC 9457). ' +
        ENGINE_CAUTION,
    },
    servers: [{ url: publicUrl }],
    tags: [...new Set(operations.map((o) => o.tag))].map((name) => ({ name })),
    paths,
    components: {
      schemas,
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'laminote.sid', description: 'The app’s session after OpenID Connect sign-in; changes also need the X-XSRF-TOKEN header.' },
        token: { type: 'http', scheme: 'bearer', description: 'A personal API token (lmn_…).' },
      },
    },
  };
}
