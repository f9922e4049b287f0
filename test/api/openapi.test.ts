import { compileErrors, validate } from '@readme/openapi-parser';
import type {
  ExampleObject,
  OpenAPIObject,
  OperationObject,
  ParameterObject,
  RequestBodyObject,
  ResponseObject,
  SchemaObject,
} from 'openapi3-ts/oas31';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { EXAMPLE_IDS } from '../../api/openapi/example-ids.js';
import { CreatedKeyViewSchema, KeyListSchema } from '../../api/schemas/key-schemas.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { EXPECTED_STATUS } from '../../api/openapi/example.js';
import { ComparisonViewSchema } from '../../api/schemas/comparison-view-schema.js';
import { CoreShapeListSchema } from '../../api/schemas/core-shape-list-schema.js';
import { DesignViewSchema } from '../../api/schemas/design-view-schema.js';
import { HealthSchema } from '../../api/schemas/health-schema.js';
import { JobViewSchema } from '../../api/schemas/job-view-schema.js';
import { JOB_COMPUTATIONS, type JobKind } from '../../solvers/index.js';
import { MaterialListSchema } from '../../api/schemas/material-list-schema.js';
import {
  MaterialViewSchema,
  UserMaterialViewSchema,
} from '../../api/schemas/material-view-schema.js';
import { ProblemSchema } from '../../api/schemas/problem-schema.js';
import { RevisionListSchema } from '../../api/schemas/revision-list-schema.js';
import { WireListSchema } from '../../api/schemas/wire-list-schema.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';
import { expectFiniteJson } from '../helpers/expect-finite-json.js';

let api: ApiTestApp;
let document: OpenAPIObject;
const jobsToCancel: string[] = [];
beforeAll(async () => {
  api = await startApiTestApp();
  const response = await api.http.get('/openapi.json');
  expect(response.status).toBe(200);
  document = response.body as OpenAPIObject;
});
afterAll(async () => {
  for (const location of jobsToCancel) await api.http.delete(location);
  await api.close();
});

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

function operations(): {
  path: string;
  method: (typeof METHODS)[number];
  operation: OperationObject;
}[] {
  return Object.entries(document.paths ?? {}).flatMap(([path, item]) =>
    METHODS.flatMap((method) => {
      const operation = item[method];
      return operation ? [{ path, method, operation }] : [];
    }),
  );
}

/** Unit symbols a description must name for a property whose name ends in the suffix. */
const UNIT_SYMBOLS: Record<string, string[]> = {
  Ohm: ['Ω'],
  Hz: ['Hz'],
  M2: ['m²'],
  M3: ['m³'],
  Ms: ['ms'],
  PerS: ['1/s'],
  V: ['V'],
  A: ['A'],
  W: ['W'],
  J: ['J'],
  H: ['H'],
  F: ['F'],
  C: ['°C', 'C'],
  T: ['T'],
  M: ['m'],
  S: ['s'],
};
const SUFFIX = /[a-z0-9](Ohm|Hz|M2|M3|Ms|PerS|V|A|W|J|H|F|C|T|M|S)$/;

function isNumeric(schema: SchemaObject): boolean {
  const type = schema.type;
  if (type === 'number' || type === 'integer') return true;
  return type === 'array' && !!schema.items && isNumeric(schema.items as SchemaObject);
}

/** Every numeric property in a schema tree: its path, name and schema. */
function numericProperties(schema: SchemaObject, path: string): [string, string, SchemaObject][] {
  const found: [string, string, SchemaObject][] = [];
  for (const [name, child] of Object.entries(schema.properties ?? {})) {
    const sub = child as SchemaObject;
    if (isNumeric(sub)) found.push([`${path}.${name}`, name, sub]);
    found.push(...numericProperties(sub, `${path}.${name}`));
  }
  for (const key of ['items', 'additionalProperties'] as const) {
    const sub = schema[key];
    if (sub && typeof sub === 'object')
      found.push(...numericProperties(sub as SchemaObject, `${path}[]`));
  }
  for (const key of ['oneOf', 'anyOf', 'allOf'] as const) {
    (schema[key] ?? []).forEach((sub, index) =>
      found.push(...numericProperties(sub as SchemaObject, `${path}|${index}`)),
    );
  }
  return found;
}

describe('GET /openapi.json', () => {
  it('GET /openapi.json is an OpenAPI 3.1 document that @readme/openapi-parser validates', async () => {
    expect(document.openapi).toBe('3.1.0');
    // The parser resolves and rewrites what it is given; hand it a copy.
    const result = await validate(structuredClone(document) as never);
    expect(result.valid, result.valid ? '' : compileErrors(result)).toBe(true);
  });

  it("GET /openapi.json has components for Spec, Design, Problem, Issue, Job and each job kind's result", () => {
    const schemas = document.components?.schemas ?? {};
    for (const name of [
      'Spec',
      'ResolvedSpec',
      'Design',
      'Problem',
      'Issue',
      'Job',
      'SweepRequest',
      'SweepResult',
      'CoreSearchResult',
      'CoreSearchCandidate',
      'ToleranceResult',
    ]) {
      expect(schemas[name], name).toBeDefined();
    }
  });

  it("documents every job kind's result: JobResult.output is one of SweepResult, CoreSearchResult and ToleranceResult", () => {
    const output = (document.components?.schemas?.JobResult as SchemaObject).properties
      ?.output as SchemaObject;
    expect((output.anyOf ?? []).map((schema) => (schema as { $ref?: string }).$ref)).toEqual([
      '#/components/schemas/SweepResult',
      '#/components/schemas/CoreSearchResult',
      '#/components/schemas/ToleranceResult',
    ]);
  });

  it('every numeric field in the components has a description naming the unit its suffix says', () => {
    const problems: string[] = [];
    for (const [component, schema] of Object.entries(document.components?.schemas ?? {})) {
      for (const [path, name, sub] of numericProperties(schema as SchemaObject, component)) {
        const description = sub.description ?? '';
        if (!description) {
          problems.push(`${path}: no description`);
          continue;
        }
        const suffix = SUFFIX.exec(name)?.[1];
        if (!suffix) continue;
        const symbols = UNIT_SYMBOLS[suffix] ?? [];
        const named = symbols.some((symbol) =>
          new RegExp(`(?:,|\\bin) ${symbol}(?=[.;:,)\\s]|$)`).test(description),
        );
        if (!named)
          problems.push(`${path}: "${description}" does not name ${symbols.join(' or ')}`);
      }
    }
    expect(problems).toEqual([]);
  });

  it('every operation that takes input has an example that succeeds, and every example names a documented status', () => {
    for (const { path, method, operation } of operations()) {
      const examples = exampleRequests(operation);
      const hasInput =
        (operation.parameters?.length ?? 0) > 0 || operation.requestBody !== undefined;
      if (hasInput) {
        expect(
          examples.some((example) => example.status < 300),
          `${method} ${path} has no succeeding example`,
        ).toBe(true);
      }
      for (const example of examples) {
        expect(
          operation.responses?.[String(example.status)],
          `${method} ${path} ${example.key}`,
        ).toBeDefined();
      }
    }
  });
});

interface ExampleRequest {
  key: string;
  status: number;
  pathParams: Record<string, unknown>;
  query: Record<string, unknown>;
  body?: unknown;
}

/** The example requests of an operation: the examples sharing a key, with their status. */
function exampleRequests(operation: OperationObject): ExampleRequest[] {
  const requests = new Map<string, ExampleRequest>();
  const entry = (key: string, example: ExampleObject) => {
    const status = example[EXPECTED_STATUS] as number;
    const request = requests.get(key) ?? { key, status, pathParams: {}, query: {} };
    expect(request.status, `example ${key}: statuses disagree`).toBe(status);
    requests.set(key, request);
    return request;
  };
  for (const parameter of (operation.parameters ?? []) as ParameterObject[]) {
    for (const [key, example] of Object.entries(parameter.examples ?? {}) as [
      string,
      ExampleObject,
    ][]) {
      const request = entry(key, example);
      (parameter.in === 'path' ? request.pathParams : request.query)[parameter.name] =
        example.value;
    }
  }
  const body = operation.requestBody as RequestBodyObject | undefined;
  for (const [key, example] of Object.entries(
    body?.content['application/json']?.examples ?? {},
  ) as [string, ExampleObject][]) {
    entry(key, example).body = example.value;
  }
  return [...requests.values()];
}

const smallSweep = { kind: 'sweep', input: { spec: EXAMPLE_SPECS.logicSupply } };

async function waitForJob(location: string, isDone: (state: string) => boolean) {
  for (;;) {
    const response = await api.http.get(location);
    if (isDone(response.body.state)) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** A real id for each placeholder the document's examples use; fresh resources every time. */
async function realId(placeholder: unknown): Promise<unknown> {
  switch (placeholder) {
    case EXAMPLE_IDS.design: {
      const created = await api.http.post('/v1/designs').send({ spec: EXAMPLE_SPECS.packagingAux });
      return created.body.id;
    }
    case EXAMPLE_IDS.finishedJob: {
      const submitted = await api.http.post('/v1/jobs').send(smallSweep);
      await waitForJob(submitted.headers.location as string, (state) => state === 'completed');
      return submitted.body.id;
    }
    case EXAMPLE_IDS.unfinishedJob: {
      // The one in-process slot is kept busy by a large sweep, so the next job stays queued.
      const blocker = await api.http.post('/v1/jobs').send({
        kind: 'sweep',
        input: {
          spec: EXAMPLE_SPECS.packagingAux,
          grid: { inputVoltagesV: Array.from({ length: 1000 }, (_, index) => 36 + index * 0.036) },
        },
      });
      jobsToCancel.push(blocker.headers.location as string);
      const queued = await api.http.post('/v1/jobs').send(smallSweep);
      return queued.body.id;
    }
    case EXAMPLE_IDS.apiKey: {
      const created = await api.http
        .post('/v1/admin/keys')
        .send({ role: 'read', label: 'invented example key' });
      return created.body.id;
    }
    default:
      return placeholder;
  }
}

const RESPONSE_SCHEMAS: Record<string, z.ZodType> = {
  DesignView: DesignViewSchema,
  Comparison: ComparisonViewSchema,
  Job: JobViewSchema,
  Problem: ProblemSchema,
  RevisionList: RevisionListSchema,
  Health: HealthSchema,
  CoreShapeList: CoreShapeListSchema,
  Material: MaterialViewSchema,
  MaterialList: MaterialListSchema,
  UserMaterial: UserMaterialViewSchema,
  WireList: WireListSchema,
  CreatedApiKey: CreatedKeyViewSchema,
  ApiKeyList: KeyListSchema,
};

describe('the documented examples, replayed', () => {
  it('every example request in the document gets its documented status, media type and schema', async () => {
    let replayed = 0;
    for (const { path, method, operation } of operations()) {
      const examples = exampleRequests(operation);
      const requests =
        examples.length > 0
          ? examples
          : [{ key: '(no input)', status: 200, pathParams: {}, query: {} }];
      for (const example of requests) {
        let url = path;
        for (const [name, value] of Object.entries(example.pathParams)) {
          url = url.replace(`{${name}}`, encodeURIComponent(String(await realId(value))));
        }
        expect(url, `${method} ${path} ${example.key}: unfilled path parameter`).not.toMatch(
          /[{}]/,
        );
        let request = api.http[method](url).query(example.query as Record<string, string>);
        if ('body' in example) request = request.send(example.body as object);
        const response = await request;
        const label = `${method.toUpperCase()} ${path} example '${example.key}'`;
        expect(response.status, `${label}: ${response.text.slice(0, 400)}`).toBe(example.status);
        const documented = operation.responses?.[String(example.status)] as ResponseObject;
        const [mediaType, content] = Object.entries(documented.content ?? {})[0] ?? [];
        // A documented answer without content (204) has no media type to check.
        if (mediaType !== undefined)
          expect(response.headers['content-type'], label).toContain(mediaType);
        if (mediaType?.includes('json')) {
          expectFiniteJson(response.text);
          const ref = (content?.schema as { $ref?: string } | undefined)?.$ref?.split('/').at(-1);
          const schema = ref === undefined ? undefined : RESPONSE_SCHEMAS[ref];
          if (schema) {
            const parsed = schema.safeParse(response.body);
            expect(parsed.success, `${label}: ${parsed.error?.message}`).toBe(true);
          }
        }
        if (example.status === 201 || example.status === 202)
          expect(response.headers.location).toBeDefined();
        replayed += 1;
      }
    }
    expect(replayed).toBeGreaterThanOrEqual(20);
  });
});

describe('the documented job examples, run to completion', () => {
  it("every accepted POST /v1/jobs example completes, with an output its kind's documented schema holds whole", async () => {
    const operation = document.paths?.['/v1/jobs']?.post as OperationObject;
    const accepted = exampleRequests(operation).filter((example) => example.status === 202);
    const kinds = new Set<string>();
    // The replay's blocker would hold the one in-process slot: it has served its purpose.
    for (const location of jobsToCancel) await api.http.delete(location);
    for (const example of accepted) {
      const body = example.body as { kind: JobKind };
      const submitted = await api.http.post('/v1/jobs').send(body);
      expect(submitted.status, example.key).toBe(202);
      const location = submitted.headers.location as string;
      await waitForJob(location, (state) => state !== 'queued' && state !== 'running');
      const view = JobViewSchema.parse((await api.http.get(location)).body);
      expect(view.state, `${example.key}: ${view.failureReason}`).toBe('completed');
      const schema = JOB_COMPUTATIONS[body.kind].outputSchema;
      if (schema === undefined) throw new Error(`${body.kind} documents no result`);
      // Parsed and compared: nothing of the real result is left out of the documented shape.
      expect(schema.parse(view.result?.output), example.key).toEqual(view.result?.output);
      // Each example shows a real answer: a search that finds builds, a feasible tolerance run.
      const output = view.result?.output as { paretoFront?: unknown[]; feasible?: boolean };
      if (body.kind === 'core-search') expect(output.paretoFront?.length).toBeGreaterThan(0);
      if (body.kind === 'tolerance') expect(output.feasible).toBe(true);
      kinds.add(body.kind);
    }
    expect([...kinds].sort()).toEqual(Object.keys(JOB_COMPUTATIONS).sort());
  });
});
