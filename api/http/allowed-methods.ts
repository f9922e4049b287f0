import type { OpenAPIObject } from 'openapi3-ts/oas31';

const METHODS = ['get', 'put', 'post', 'delete', 'patch', 'head', 'options'] as const;

/**
 * A lookup from a request path to the methods the OpenAPI document offers on it (upper case),
 * or undefined when no documented path matches. Path templates like `/v1/jobs/{id}` match one
 * segment per parameter. Built once from the same document the service publishes.
 */
export function allowedMethods(document: OpenAPIObject): (path: string) => string[] | undefined {
  const routes = Object.entries(document.paths ?? {}).map(([template, item]) => {
    const pattern = template
      .split('/')
      .map((segment) =>
        /^\{[^}]+\}$/.test(segment) ? '[^/]+' : segment.replace(/[.*+?^$()|[\]\\]/g, '\\$&'),
      )
      .join('/');
    const methods = METHODS.filter((method) => item[method] !== undefined).map((method) =>
      method.toUpperCase(),
    );
    return { regex: new RegExp(`^${pattern}/?$`), methods };
  });
  return (path) => routes.find((route) => route.regex.test(path))?.methods;
}
