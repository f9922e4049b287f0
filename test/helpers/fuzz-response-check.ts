/**
 * The promises every answer keeps whatever it was asked (issue 6): never a 5xx; every 4xx is
 * application/problem+json with a type, title and status, and a 400 about a body names each bad
 * field by its path; every 2xx JSON body parses, and no loss in it is negative.
 * Returns what is wrong with the answer, or undefined.
 */
export async function fuzzResponseProblem(response: Response): Promise<string | undefined> {
  const text = await response.text();
  const status = response.status;
  const type = response.headers.get('content-type') ?? '';
  if (status >= 500) return `status ${status}: ${text.slice(0, 300)}`;
  if (status >= 400) {
    if (!type.startsWith('application/problem+json')) return `${status} with content-type ${type}`;
    const body = JSON.parse(text) as Record<string, unknown>;
    if (typeof body['type'] !== 'string' || typeof body['title'] !== 'string') {
      return `${status} problem without type or title: ${text.slice(0, 300)}`;
    }
    if (body['status'] !== status) return `problem status ${String(body['status'])} ≠ ${status}`;
    if (status === 400 && String(body['type']).endsWith(':invalid-body')) {
      const errors = body['errors'];
      if (!Array.isArray(errors) || errors.length === 0) return `400 without errors: ${text}`;
      for (const error of errors as Array<Record<string, unknown>>) {
        if (!Array.isArray(error['path']))
          return `400 error without a path: ${JSON.stringify(error)}`;
      }
    }
    return undefined;
  }
  if (type.startsWith('application/json')) {
    const negative = negativeLosses(JSON.parse(text));
    if (negative.length > 0) return `negative losses: ${negative.slice(0, 5).join(', ')}`;
  }
  return undefined;
}

/** Paths of numbers under a key that names a loss in watts (…LossW, lossTotalW, …) below 0. */
function negativeLosses(value: unknown, at = '$'): string[] {
  if (Array.isArray(value))
    return value.flatMap((item, index) => negativeLosses(item, `${at}[${index}]`));
  if (value === null || typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([key, item]) => {
    const path = `${at}.${key}`;
    if (typeof item === 'number' && /loss/i.test(key) && key.endsWith('W') && item < 0) {
      return [`${path}=${item}`];
    }
    return negativeLosses(item, path);
  });
}
