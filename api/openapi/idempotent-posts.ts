import type { ParameterObject, PathsObject } from 'openapi3-ts/oas31';
import { problemResponses } from './responses.js';

const IDEMPOTENCY_KEY: ParameterObject = {
  name: 'Idempotency-Key',
  in: 'header',
  required: false,
  description:
    'Makes the request safe to retry: 1 to 255 visible ASCII characters, new for each request (a UUID, for example). A retry with the same key, method, path, query string and body gets the first answer again, with `Idempotency-Replayed: true`, and creates nothing; the same key with another request (another `include`, say) is 409; a retry while the first still runs is 409 with Retry-After. Answers are kept for IDEMPOTENCY_TTL_S (24 h by default); 5xx answers are not kept.',
  schema: { type: 'string', minLength: 1, maxLength: 255, pattern: '^[\\x21-\\x7e]+$' },
};

/** `paths` with the Idempotency-Key header and its 409 on every POST under /v1. */
export function withIdempotentPosts(paths: PathsObject): PathsObject {
  return Object.fromEntries(
    Object.entries(paths).map(([path, item]) => {
      const post = item.post;
      if (!path.startsWith('/v1/') || post === undefined) return [path, item];
      return [
        path,
        {
          ...item,
          post: {
            ...post,
            parameters: [...(post.parameters ?? []), IDEMPOTENCY_KEY],
            responses: { ...problemResponses(409), ...post.responses },
          },
        },
      ];
    }),
  );
}
