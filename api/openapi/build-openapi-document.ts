import { OpenApiBuilder } from 'openapi3-ts/oas31';
import type { OpenAPIObject } from 'openapi3-ts/oas31';
import { SCHEMA_VERSION, SOLVER_VERSION } from '../../solvers/index.js';
import { CAUTION } from '../caution.js';
import type { AppConfig } from '../config.js';
import { catalogPaths } from './catalog-paths.js';
import { comparisonPaths } from './comparison-paths.js';
import { componentSchemas } from './component-schemas.js';
import { designPaths } from './design-paths.js';
import { EXPECTED_STATUS } from './example.js';
import { withIdempotentPosts } from './idempotent-posts.js';
import { jobPaths } from './job-paths.js';
import { keyPaths } from './key-paths.js';
import { API_KEY_SCHEME, withSecuredOperations } from './secured-operations.js';
import { servicePaths } from './service-paths.js';

const DESCRIPTION = `Designs transformer-isolated DC-DC converters from a specification.

**Caution.** ${CAUTION}

Conventions:
- Units: SI base units in every field (V, A, W, Hz, H, F, Ω, T, m, s), temperatures in °C; each name ends in its unit. Dimensionless values are fractions 0..1.
- Errors are application/problem+json (RFC 9457). A 400 lists each bad field in \`errors\` with \`path\` as an array of keys and indexes from the root of the body (for example \`["spec","outputs",0,"voltageV"]\`; for a parameter, its name). A 422 carries the engine issues as data in \`issues\`, with paths relative to the engine input (the spec, or the job input).
- Results carry \`meta\`: solver version, schema version, SHA-256 of the canonical parsed input, creation time.
- Examples are invented scenarios. Examples of one operation that share a key form one request; \`${EXPECTED_STATUS}\` names the status it gets. Ids in examples stand for ids the service returned, as each example says.`;

/** The OpenAPI 3.1 document of the service, generated from the validating zod schemas. */
export function buildOpenApiDocument(config: Pick<AppConfig, 'jobSizeLimits'>): OpenAPIObject {
  const builder = OpenApiBuilder.create()
    .addOpenApiVersion('3.1.0')
    .addInfo({
      title: 'Isolated converter design service',
      version: `${SOLVER_VERSION} (schema ${SCHEMA_VERSION})`,
      description: DESCRIPTION,
    })
    .addTag({ name: 'designs', description: 'Evaluate specs inline; immutable revisions.' })
    .addTag({
      name: 'comparisons',
      description: 'Several topologies on one spec, ranked; not stored.',
    })
    .addTag({ name: 'jobs', description: 'Heavy work in the background.' })
    .addTag({
      name: 'catalog',
      description:
        'Core shapes, materials and wires the engine knows; user materials from loss points (shared by every caller for now).',
    })
    .addTag({ name: 'admin', description: "API keys of the caller's tenant." })
    .addTag({ name: 'service', description: 'Health, metrics and this document.' })
    .addSecurityScheme('apiKey', API_KEY_SCHEME);
  for (const [name, schema] of Object.entries(componentSchemas())) builder.addSchema(name, schema);
  const paths = withSecuredOperations(
    withIdempotentPosts({
      ...designPaths(),
      ...comparisonPaths(),
      ...jobPaths(config),
      ...catalogPaths(),
      ...keyPaths(),
      ...servicePaths(),
    }),
  );
  for (const [path, item] of Object.entries(paths)) builder.addPath(path, item);
  return { ...builder.getSpec(), security: [{ apiKey: [] }] };
}
