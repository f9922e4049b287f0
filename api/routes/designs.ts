import { Hono } from 'hono';
import { z } from 'zod';
import { tenantOf } from '../auth/caller.js';
import { designViewJson } from '../designs/design-view.js';
import { evaluateSpec } from '../designs/evaluate-spec.js';
import { netlistText } from '../designs/netlist-text.js';
import { infeasibleProblem } from '../errors/infeasible-problem.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { readJsonBody } from '../http/read-json-body.js';
import { readParams } from '../http/read-params.js';
import { sendJson, sendJsonText } from '../http/send-json.js';
import { DesignRequestSchema } from '../schemas/design-request-schema.js';
import type { DesignStore } from '../stores/design-store.js';
import type { MaterialStore } from '../stores/material-store.js';

const revisionNumber = z.coerce.number().int().min(1).max(Number.MAX_SAFE_INTEGER);
const RevisionParamsSchema = z.object({ revision: revisionNumber });
const NetlistQuerySchema = z.object({
  revision: revisionNumber.optional(),
  corner: z.string().min(1).optional(),
});

const notFound = (what: string) =>
  new ProblemError(PROBLEM_TYPES.notFound, { detail: `no ${what}` });

/**
 * /v1/designs: evaluate specs inline (a user material they name looked up in `materials`), store
 * them as immutable revisions, read them back. `onEngineCpuS` is told the engine's CPU time of
 * each evaluation, s.
 */
export function designRoutes({
  designs,
  materials,
  onEngineCpuS,
}: {
  designs: DesignStore;
  materials: MaterialStore;
  onEngineCpuS?: (seconds: number) => void;
}): Hono {
  const routes = new Hono();
  const evaluating = { materials, ...(onEngineCpuS === undefined ? {} : { onEngineCpuS }) };

  routes.post('/', async (c) => {
    const { spec } = await readJsonBody(c, DesignRequestSchema);
    const tenant = tenantOf(c);
    const evaluated = await evaluateSpec(spec, { ...evaluating, tenant });
    if (!evaluated.ok) throw infeasibleProblem(evaluated.issues);
    const record = await designs.create(tenant, evaluated.value);
    return sendJsonText(c, 201, designViewJson(record), { location: `/v1/designs/${record.id}` });
  });

  routes.get('/:id', async (c) => {
    const record = await designs.latest(tenantOf(c), c.req.param('id'));
    if (!record) throw notFound(`design ${c.req.param('id')}`);
    return sendJsonText(c, 200, designViewJson(record));
  });

  routes.post('/:id/revisions', async (c) => {
    const id = c.req.param('id');
    const { spec } = await readJsonBody(c, DesignRequestSchema);
    // 404 before evaluating: a missing design outranks anything wrong with the spec.
    const tenant = tenantOf(c);
    if (!(await designs.listRevisions(tenant, id))) throw notFound(`design ${id}`);
    const evaluated = await evaluateSpec(spec, { ...evaluating, tenant });
    if (!evaluated.ok) throw infeasibleProblem(evaluated.issues);
    const record = await designs.appendRevision(tenant, id, evaluated.value);
    if (!record) throw notFound(`design ${id}`);
    const location = `/v1/designs/${record.id}/revisions/${record.revision}`;
    return sendJsonText(c, 201, designViewJson(record), { location });
  });

  routes.get('/:id/revisions', async (c) => {
    const items = await designs.listRevisions(tenantOf(c), c.req.param('id'));
    if (!items) throw notFound(`design ${c.req.param('id')}`);
    return sendJson(c, 200, { items });
  });

  routes.get('/:id/revisions/:revision', async (c) => {
    const { revision } = readParams(c.req.param(), RevisionParamsSchema);
    const record = await designs.revision(tenantOf(c), c.req.param('id'), revision);
    if (!record) throw notFound(`revision ${revision} of design ${c.req.param('id')}`);
    return sendJsonText(c, 200, designViewJson(record));
  });

  routes.get('/:id/netlist', async (c) => {
    const id = c.req.param('id');
    const { revision, corner } = readParams(c.req.query(), NetlistQuerySchema);
    const record =
      revision === undefined
        ? await designs.latest(tenantOf(c), id)
        : await designs.revision(tenantOf(c), id, revision);
    if (!record)
      throw notFound(`design ${id}${revision === undefined ? '' : ` revision ${revision}`}`);
    return c.text(netlistText(record, corner), 200, {
      'content-type': 'text/plain; charset=utf-8',
    });
  });

  return routes;
}
