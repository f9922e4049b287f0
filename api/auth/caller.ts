import type { Context } from 'hono';
import type { Role } from './api-key.js';

/** Who is calling: the tenant and role of the key the request authenticated with. */
export interface Caller {
  tenant: string;
  role: Role;
  /** The key's public id (never its token). */
  keyId: string;
}

declare module 'hono' {
  interface ContextVariableMap {
    caller: Caller;
  }
}

/**
 * The authenticated caller of a request under /v1.
 * @throws Error when called on a route `authenticate` does not guard (a wiring bug).
 */
export function callerOf(c: Context): Caller {
  const caller = c.get('caller');
  if (caller === undefined) throw new Error(`no authenticated caller on ${c.req.path}`);
  return caller;
}

/** The tenant whose data a request under /v1 may see. */
export function tenantOf(c: Context): string {
  return callerOf(c).tenant;
}
