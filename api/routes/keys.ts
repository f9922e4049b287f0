import { Hono } from 'hono';
import { callerOf } from '../auth/caller.js';
import { createKey, keyView } from '../auth/create-key.js';
import type { KeyStore } from '../auth/key-store.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { readJsonBody } from '../http/read-json-body.js';
import { sendJson } from '../http/send-json.js';
import { KeyRequestSchema } from '../schemas/key-schemas.js';

/**
 * /v1/admin/keys: an admin key creates, lists and revokes the keys of its own tenant (another
 * tenant's key id answers 404, as an unknown one does). `npm run keys` does the same from the
 * command line for any tenant.
 */
export function keyRoutes({ keys }: { keys: KeyStore }): Hono {
  const routes = new Hono();

  routes.post('/', async (c) => {
    const request = await readJsonBody(c, KeyRequestSchema);
    const { tenant } = callerOf(c);
    const { record, token } = await createKey(keys, { tenant, ...request });
    const view = { ...keyView(record), key: token };
    return sendJson(c, 201, view, { location: view.links.self });
  });

  routes.get('/', async (c) => {
    const items = (await keys.list(callerOf(c).tenant)).map(keyView);
    return sendJson(c, 200, { items });
  });

  routes.delete('/:id', async (c) => {
    const id = c.req.param('id');
    const { tenant } = callerOf(c);
    if (!(await keys.revoke(tenant, id, new Date().toISOString()))) {
      throw new ProblemError(PROBLEM_TYPES.notFound, { detail: `no key ${id}` });
    }
    return c.body(null, 204);
  });

  return routes;
}
