// The OpenAPI 3.1 document, generated from the routes' zod schemas, and a readable docs page.
import express from 'express';
import swaggerUi from 'swagger-ui-express';
import { OpenApiGeneratorV31, type OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';

export function buildOpenApiDocument(registry: OpenAPIRegistry, version: string) {
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Emberline API',
      version,
      description:
        'The API behind the Emberline Directory and Console. Errors are RFC 9457 problem details (application/problem+json) with a stable `code` and field `errors`; successful bodies are `{ data, meta? }`.',
    },
    servers: [{ url: '/' }],
  });
}

export function docsRouter(registry: OpenAPIRegistry, version: string): express.Router {
  const router = express.Router();
  let cached: ReturnType<typeof buildOpenApiDocument> | undefined;
  router.get('/openapi.json', (_req, res) => {
    cached ??= buildOpenApiDocument(registry, version);
    res.json(cached);
  });
  router.use('/docs', swaggerUi.serve);
  router.get('/docs', swaggerUi.setup(undefined, {
    customSiteTitle: 'Emberline API reference',
    swaggerOptions: { url: '/api/openapi.json' },
  }));
  return router;
}
