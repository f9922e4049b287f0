import type { MiddlewareHandler } from 'hono';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { hashesEqual, keyHash, keyIdOf, ROLES, roleAllows, type Role } from './api-key.js';
import type { ApiKeyRecord, KeyStore } from './key-store.js';
import { RATE_WINDOW_MS, rateWindowStartMs } from './rate-limit.js';
import './caller.js';
import '../observability/request-context.js';

/** Paths anyone may read: liveness, readiness and the OpenAPI document. */
const OPEN_PATHS = new Set(['/healthz', '/readyz', '/openapi.json']);

/** The role a request needs: reads need 'read', key management 'admin', other writes 'design'. */
function roleNeeded(method: string, path: string): Role {
  if (path.startsWith('/v1/admin/')) return 'admin';
  return method === 'GET' || method === 'HEAD' || method === 'OPTIONS' ? 'read' : 'design';
}

const unauthenticated = (detail: string) =>
  new ProblemError(PROBLEM_TYPES.unauthenticated, {
    detail,
    headers: { 'www-authenticate': 'Bearer realm="design-service"' },
  });

/**
 * Requires an API key on every path but the open ones: `Authorization: Bearer <key>`, looked up
 * by its id and checked against the stored SHA-256 in constant time; a missing, malformed,
 * unknown, revoked or wrong key is 401 with WWW-Authenticate (RFC 6750 §3), all alike; a key
 * whose role does not allow the operation is 403. The caller (tenant, role, key id) is then
 * `c.get('caller')`, and the request's logger carries the tenant and key id. With
 * `countRequests` and a store that offers findCounting, the request is counted for the rate
 * limit in the key's lookup (one round trip for both; `c.get('countedRequest')`), only when it
 * passes these checks: rateLimit then judges that count instead of counting again.
 */
export function authenticate(deps: {
  keys: KeyStore;
  countRequests?: boolean;
  now?: () => number;
}): MiddlewareHandler {
  const { keys, countRequests = false, now = Date.now } = deps;
  const rolesAllowing = (needed: Role) => ROLES.filter((held) => roleAllows(held, needed));
  return async (c, next) => {
    if (OPEN_PATHS.has(c.req.path)) return next();
    const header = c.req.header('authorization') ?? '';
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (match === null) {
      throw unauthenticated('send an API key as `Authorization: Bearer <key>`');
    }
    const token = match[1] as string;
    const id = keyIdOf(token);
    const needed = roleNeeded(c.req.method, c.req.path);
    const tokenHash = id === undefined ? '' : keyHash(token);
    let record: ApiKeyRecord | undefined;
    if (id !== undefined && countRequests && keys.findCounting !== undefined) {
      const windowStartMs = rateWindowStartMs(now());
      const found = await keys.findCounting(id, {
        tokenHash,
        roles: rolesAllowing(needed),
        windowStartMs,
        windowMs: RATE_WINDOW_MS,
      });
      record = found.record;
      if (found.count !== undefined) c.set('countedRequest', { windowStartMs, count: found.count });
    } else if (id !== undefined) {
      record = await keys.find(id);
    }
    if (
      record === undefined ||
      record.revokedAt !== undefined ||
      !hashesEqual(record.hash, tokenHash)
    ) {
      throw unauthenticated('the API key is not valid (unknown, revoked or mistyped)');
    }
    if (!roleAllows(record.role, needed)) {
      throw new ProblemError(PROBLEM_TYPES.forbidden, {
        detail: `this key's role '${record.role}' does not allow ${c.req.method} ${c.req.path} (needs '${needed}')`,
      });
    }
    c.set('caller', { tenant: record.tenant, role: record.role, keyId: record.id });
    const log = c.get('log');
    if (log !== undefined) c.set('log', log.child({ tenant: record.tenant, keyId: record.id }));
    return next();
  };
}
