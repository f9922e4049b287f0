import type { Context } from 'hono';
import type { z } from 'zod';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { validationProblem } from '../errors/validation-problem.js';

/** application/json or any application/*+json, parameters (charset) allowed. */
const JSON_MEDIA_TYPE = /^application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i;

/**
 * Reads the request body as JSON and parses it with `schema` (defaults applied). Throws a
 * ProblemError: 415 unless the body is declared JSON, 400 when it is not valid JSON or fails
 * the schema (each bad field listed).
 */
export async function readJsonBody<S extends z.ZodType>(
  c: Context,
  schema: S,
): Promise<z.output<S>> {
  const contentType = c.req.header('content-type') ?? '';
  if (!JSON_MEDIA_TYPE.test(contentType)) {
    throw new ProblemError(PROBLEM_TYPES.unsupportedMediaType, {
      detail: `send the body as application/json (got ${contentType ? `'${contentType}'` : 'no content-type'})`,
    });
  }
  const text = await c.req.text();
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    const reason = error instanceof SyntaxError ? error.message : 'unreadable';
    throw new ProblemError(PROBLEM_TYPES.malformedJson, { detail: `body is not JSON: ${reason}` });
  }
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw validationProblem(parsed.error.issues);
  return parsed.data;
}
