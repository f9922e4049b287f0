import type { HeaderObject, ResponseObject, ResponsesObject } from 'openapi3-ts/oas31';
import { PROBLEM_MEDIA_TYPE } from '../problem.js';

const ref = (id: string) => ({ $ref: `#/components/schemas/${id}` });

const RETRY_AFTER: HeaderObject = {
  description: 'Seconds to wait before retrying, s.',
  schema: { type: 'integer', minimum: 1 },
};

const WWW_AUTHENTICATE: HeaderObject = {
  description: 'The scheme to authenticate with: `Bearer realm="design-service"`.',
  schema: { type: 'string' },
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
  401: 'No API key, or one that is unknown, revoked or mistyped (with WWW-Authenticate: Bearer).',
  403: "The key's role does not allow this operation.",
  404: "No such resource (another tenant's resource answers exactly the same).",
  406: 'None of the media types the Accept header (or `format`) asks for is offered here.',
  409: 'Conflicts with what exists: the job has already finished (cancel) or has not completed (result), the material name is taken, a stored design’s waveforms cannot be recomputed (another solver version made it: post its spec again as a new revision with include=waveforms), or the Idempotency-Key was used with another request or its first request still runs (then with Retry-After).',
  413: 'The body is larger than the configured limit.',
  415: 'The body is not declared as application/json.',
  422: 'Well-formed but infeasible (or, for loss points, not fittable; or a materialId that names no material): `issues` names each violated constraint with its numbers.',
  429: 'The key sent more than RATE_LIMIT_PER_MINUTE requests this minute, or (job submission) its tenant already has JOBS_PER_TENANT_MAX unfinished jobs; retry after Retry-After seconds.',
  503: 'A backend is down (with Redis: the store of keys, designs or materials, or the job queue); retry after Retry-After seconds. Nothing accepted before is lost: the service recovers by itself once the backend is back.',
};

/** Problem responses (application/problem+json) for the given statuses. */
export function problemResponses(...statuses: number[]): ResponsesObject {
  return Object.fromEntries(
    statuses.map((status) => [
      String(status),
      {
        description: PROBLEM_DESCRIPTIONS[status] ?? 'A problem.',
        ...(status === 503 || status === 429 ? { headers: { 'Retry-After': RETRY_AFTER } } : {}),
        ...(status === 401 ? { headers: { 'WWW-Authenticate': WWW_AUTHENTICATE } } : {}),
        content: { [PROBLEM_MEDIA_TYPE]: { schema: ref('Problem') } },
      } satisfies ResponseObject,
    ]),
  );
}
