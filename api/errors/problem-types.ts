/**
 * The problem types this service answers with (RFC 9457 §3.1.1 `type` and `title`), by status.
 * Domain-specific types are tag URIs (RFC 4151): stable identifiers, not meant to be fetched.
 * Statuses whose meaning says everything use `about:blank` with the status phrase as title.
 */
const tag = (slug: string) => `tag:isolated-converter-design,2026:problem:${slug}`;

export const PROBLEM_TYPES = {
  invalidBody: { status: 400, type: tag('invalid-body'), title: 'Request body is invalid' },
  malformedJson: { status: 400, type: tag('malformed-json'), title: 'Request body is not JSON' },
  invalidParameter: {
    status: 400,
    type: tag('invalid-parameter'),
    title: 'Request parameter is invalid',
  },
  unauthenticated: { status: 401, type: 'about:blank', title: 'Unauthorized' },
  forbidden: { status: 403, type: 'about:blank', title: 'Forbidden' },
  notFound: { status: 404, type: 'about:blank', title: 'Not Found' },
  methodNotAllowed: { status: 405, type: 'about:blank', title: 'Method Not Allowed' },
  notAcceptable: { status: 406, type: 'about:blank', title: 'Not Acceptable' },
  jobFinished: { status: 409, type: tag('job-finished'), title: 'Job has already finished' },
  jobNotCompleted: {
    status: 409,
    type: tag('job-not-completed'),
    title: 'Job has no result',
  },
  materialNameTaken: {
    status: 409,
    type: tag('material-name-taken'),
    title: 'Material name is already taken',
  },
  idempotencyKeyReused: {
    status: 409,
    type: tag('idempotency-key-reused'),
    title: 'Idempotency key was used with another request',
  },
  idempotencyInProgress: {
    status: 409,
    type: tag('idempotency-in-progress'),
    title: 'A request with this idempotency key is still running',
  },
  waveformsNotReproducible: {
    status: 409,
    type: tag('waveforms-not-reproducible'),
    title: "Stored design's waveforms cannot be recomputed",
  },
  payloadTooLarge: { status: 413, type: 'about:blank', title: 'Content Too Large' },
  unsupportedMediaType: { status: 415, type: 'about:blank', title: 'Unsupported Media Type' },
  infeasibleSpec: {
    status: 422,
    type: tag('infeasible-spec'),
    title: 'Specification is physically infeasible',
  },
  lossPointsNotFittable: {
    status: 422,
    type: tag('loss-points-not-fittable'),
    title: 'Loss points cannot be fitted',
  },
  unknownMaterial: {
    status: 422,
    type: tag('unknown-material'),
    title: 'Material is not in the catalog',
  },
  jobTooLarge: { status: 422, type: tag('job-too-large'), title: 'Job is larger than allowed' },
  tooManyRequests: { status: 429, type: 'about:blank', title: 'Too Many Requests' },
  tooManyJobs: {
    status: 429,
    type: tag('too-many-jobs'),
    title: 'Tenant has as many unfinished jobs as it may',
  },
  unavailable: { status: 503, type: tag('backend-unavailable'), title: 'Backend unavailable' },
  internal: { status: 500, type: 'about:blank', title: 'Internal Server Error' },
} as const satisfies Record<string, { status: number; type: string; title: string }>;

/** One entry of PROBLEM_TYPES. */
export type ProblemType = (typeof PROBLEM_TYPES)[keyof typeof PROBLEM_TYPES];
