import type { HeaderObject, ResponseObject, ResponsesObject } from 'openapi3-ts/oas31';
import { PROBLEM_MEDIA_TYPE } from '../problem.js';

const ref = (id: string) => ({ $ref: `#/components/schemas/${id}` });

const RETRY_AFTER: HeaderObject = {
  description: 'Seconds to wait before retrying, s.',
  schema: { type: 'integer', minimum: 1 },
};

const LOCATION: HeaderObject = {
  description: 'Path of the resource just created.',
  schema: { type: 'string' },
};

/** A JSON response of component `id`, with a Location header when `isCreated`. */
export function jsonResponse(
  description: string,
  id: string,
  { isCreated = false }: { isCreated?: boolean } = {},
): ResponseObject {
  return {
    description,
    ...(isCreated ? { headers: { Location: LOCATION } } : {}),
    content: { 'application/json': { schema: ref(id) } },
  };
}

const PROBLEM_DESCRIPTIONS: Record<number, string> = {
  400: 'Malformed JSON, or fields that fail the schema: `errors` lists each path and what is wrong.',
  404: 'No such resource.',
  406: 'None of the media types the Accept header (or `format`) asks for is offered here.',
  409: 'Conflicts with what exists: the job has already finished (cancel), has not completed (result), or the material name is taken.',
  413: 'The body is larger than the configured limit.',
  415: 'The body is not declared as application/json.',
  422: 'Well-formed but infeasible (or, for loss points, not fittable; or a materialId that names no material): `issues` names each violated constraint with its numbers.',
  503: 'A backend (design store or job queue) is down; retry after Retry-After seconds.',
};

/** Problem responses (application/problem+json) for the given statuses. */
export function problemResponses(...statuses: number[]): ResponsesObject {
  return Object.fromEntries(
    statuses.map((status) => [
      String(status),
      {
        description: PROBLEM_DESCRIPTIONS[status] ?? 'A problem.',
        ...(status === 503 ? { headers: { 'Retry-After': RETRY_AFTER } } : {}),
        content: { [PROBLEM_MEDIA_TYPE]: { schema: ref('Problem') } },
      } satisfies ResponseObject,
    ]),
  );
}
