import { Hono } from 'hono';
import type { AppConfig } from '../config.js';
import { sendJson } from '../http/send-json.js';
import { buildOpenApiDocument } from '../openapi/build-openapi-document.js';

/** GET /openapi.json: the OpenAPI 3.1 document, built once per app. */
export function openapiRoutes(config: Pick<AppConfig, 'jobSizeLimits'>): Hono {
  const document = buildOpenApiDocument(config);
  return new Hono().get('/openapi.json', (c) => sendJson(c, 200, document));
}
