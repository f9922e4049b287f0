import type { PathsObject } from 'openapi3-ts/oas31';
import { jsonResponse, problemResponses } from './responses.js';

/** /healthz, /readyz, /metrics and /openapi.json. */
export function servicePaths(): PathsObject {
  return {
    '/healthz': {
      get: {
        operationId: 'getLiveness',
        tags: ['service'],
        summary: 'Liveness: 200 whenever the process answers',
        responses: { '200': jsonResponse('Alive.', 'Health') },
      },
    },
    '/readyz': {
      get: {
        operationId: 'getReadiness',
        tags: ['service'],
        summary: 'Readiness: the design store and the job backend both answer',
        responses: {
          '200': jsonResponse('Ready.', 'Health'),
          ...problemResponses(503),
        },
      },
    },
    '/metrics': {
      get: {
        operationId: 'getMetrics',
        tags: ['service'],
        summary: 'Prometheus metrics: requests and latency by route, job queue, the process',
        responses: {
          '200': {
            description: 'The metrics in the Prometheus text exposition format (version 0.0.4).',
            content: { 'text/plain': { schema: { type: 'string' } } },
          },
        },
      },
    },
    '/openapi.json': {
      get: {
        operationId: 'getOpenApiDocument',
        tags: ['service'],
        summary: 'This OpenAPI 3.1 document',
        responses: {
          '200': {
            description: 'The document.',
            content: { 'application/json': { schema: { type: 'object' } } },
          },
        },
      },
    },
  };
}
