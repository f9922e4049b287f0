import type { AnyChunkedComputation, JobKind } from '../../solvers/index.js';
import { InvalidPayloadError } from './invalid-payload-error.js';

/**
 * The payload of a `kind` job parsed by its computation's request schema (defaults applied).
 * Throws InvalidPayloadError, which no backend retries, naming every bad field.
 */
export function decodeJobRequest(
  kind: JobKind,
  computation: AnyChunkedComputation,
  payload: unknown,
): unknown {
  const parsed = computation.requestSchema.safeParse(payload, { reportInput: true });
  if (parsed.success) return parsed.data;
  throw new InvalidPayloadError(
    kind,
    parsed.error.issues.map((issue) => ({
      path: issue.path.map((key) => (typeof key === 'symbol' ? String(key) : key)),
      // A list over its length limit says its length too, beside the limit.
      message:
        issue.code === 'too_big' && Array.isArray(issue.input)
          ? `${issue.message}, got ${issue.input.length}`
          : issue.message,
    })),
  );
}
