import { Router } from 'express';
import type { Config } from '../config';
import { buildOpenApiDocument } from './document';

/** /api/openapi.json: the API's OpenAPI 3.1 description, made once per process from the contracts. */
export function openapiRouter({ config }: { config: Config }): Router {
  const router = Router();
  let document: string | null = null;
  router.get('/', (_req, res) => {
    document ??= JSON.stringify(buildOpenApiDocument(config.PUBLIC_URL));
    res.type('application/json').send(document);
  });
  return router;
}
