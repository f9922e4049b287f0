import { z } from 'zod';
import type { SchemaObject } from 'openapi3-ts/oas31';
import {
  CoreSearchCandidateSchema,
  CoreSearchResultSchema,
  IssueSchema,
  SpecSchema,
  SweepRequestSchema,
  SweepResultSchema,
  ToleranceJobResultSchema,
} from '../../solvers/index.js';
import { ComparisonRequestSchema } from '../schemas/comparison-request-schema.js';
import { ComparisonViewSchema } from '../schemas/comparison-view-schema.js';
import { CoreShapeListSchema } from '../schemas/core-shape-list-schema.js';
import { DesignAnswerSchema } from '../schemas/design-answer-schema.js';
import { DesignRequestSchema } from '../schemas/design-request-schema.js';
import { DesignViewSchema } from '../schemas/design-view-schema.js';
import { HealthSchema } from '../schemas/health-schema.js';
import { JobRequestSchema } from '../schemas/job-request-schema.js';
import {
  JobResultMetaSchema,
  JobResultSchema,
  JobResultViewSchema,
} from '../schemas/job-result-schema.js';
import { JobViewSchema } from '../schemas/job-view-schema.js';
import {
  CreatedKeyViewSchema,
  KeyListSchema,
  KeyRequestSchema,
  KeyViewSchema,
} from '../schemas/key-schemas.js';
import { MaterialListSchema } from '../schemas/material-list-schema.js';
import { MaterialRequestSchema } from '../schemas/material-request-schema.js';
import {
  BuiltInMaterialViewSchema,
  MaterialViewSchema,
  UserMaterialViewSchema,
} from '../schemas/material-view-schema.js';
import { ProblemSchema } from '../schemas/problem-schema.js';
import { ResultMetaSchema } from '../schemas/result-meta-schema.js';
import { RevisionListSchema } from '../schemas/revision-list-schema.js';
import { WireListSchema } from '../schemas/wire-list-schema.js';

type Registry = z.core.$ZodRegistry<{ id: string }>;

/** What clients send: converted with io 'input' (defaults optional). */
const REQUEST_SCHEMAS: [id: string, schema: z.ZodType][] = [
  ['Spec', SpecSchema],
  ['SweepRequest', SweepRequestSchema],
  ['DesignRequest', DesignRequestSchema],
  ['ComparisonRequest', ComparisonRequestSchema],
  ['JobRequest', JobRequestSchema],
  ['MaterialRequest', MaterialRequestSchema],
  ['ApiKeyRequest', KeyRequestSchema],
];

/** What the service answers: io 'output' (defaults filled in, so required). */
const RESPONSE_SCHEMAS: [id: string, schema: z.ZodType][] = [
  ['ResolvedSpec', SpecSchema],
  ['Design', DesignAnswerSchema],
  ['Issue', IssueSchema],
  ['ResultMeta', ResultMetaSchema],
  ['DesignView', DesignViewSchema],
  ['Comparison', ComparisonViewSchema],
  ['RevisionList', RevisionListSchema],
  ['SweepResult', SweepResultSchema],
  ['CoreSearchCandidate', CoreSearchCandidateSchema],
  ['CoreSearchResult', CoreSearchResultSchema],
  ['ToleranceResult', ToleranceJobResultSchema],
  ['JobResultMeta', JobResultMetaSchema],
  ['JobResult', JobResultSchema],
  ['JobResultView', JobResultViewSchema],
  ['Job', JobViewSchema],
  ['Problem', ProblemSchema],
  ['Health', HealthSchema],
  ['CoreShapeList', CoreShapeListSchema],
  ['BuiltInMaterial', BuiltInMaterialViewSchema],
  ['UserMaterial', UserMaterialViewSchema],
  ['Material', MaterialViewSchema],
  ['MaterialList', MaterialListSchema],
  ['WireList', WireListSchema],
  ['ApiKey', KeyViewSchema],
  ['CreatedApiKey', CreatedKeyViewSchema],
  ['ApiKeyList', KeyListSchema],
];

function convert(entries: [string, z.ZodType][], io: 'input' | 'output') {
  const registry: Registry = z.registry<{ id: string }>();
  for (const [id, schema] of entries) registry.add(schema, { id });
  // zod has no OpenAPI 3.1 target; 3.1 schemas are JSON Schema 2020-12 (OAS 3.1 §4.8.24).
  const { schemas } = z.toJSONSchema(registry, {
    target: 'draft-2020-12',
    io,
    uri: (id) => `#/components/schemas/${id}`,
  });
  return Object.fromEntries(
    Object.entries(schemas).map(([id, schema]) => {
      // A component is not a document of its own: drop the dialect and id zod writes on it.
      const rest: Record<string, unknown> = { ...schema };
      delete rest.$schema;
      delete rest.$id;
      return [id, rest as SchemaObject];
    }),
  );
}

/**
 * The OpenAPI components, generated from the same zod schemas that validate requests and shape
 * responses: requests as their input form, responses as their output form. References between
 * them are `#/components/schemas/<id>`.
 */
export function componentSchemas(): Record<string, SchemaObject> {
  return { ...convert(REQUEST_SCHEMAS, 'input'), ...convert(RESPONSE_SCHEMAS, 'output') };
}
