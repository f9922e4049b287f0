import { Hono } from 'hono';
import { z } from 'zod';
import { tenantOf } from '../auth/caller.js';
import { designViewJson } from '../designs/design-view.js';
import { contentWithWaveforms } from '../designs/design-with-waveforms.js';
import { evaluateSpec, type EvaluatedContent } from '../designs/evaluate-spec.js';
import { checkCornerLabel, netlistText } from '../designs/netlist-text.js';
import { jsonHasWaveforms, withoutWaveforms } from '../designs/waveforms.js';
import { infeasibleProblem } from '../errors/infeasible-problem.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { readInclude, type Included } from '../http/read-include.js';
import { readJsonBody } from '../http/read-json-body.js';
import { readParams } from '../http/read-params.js';
import { sendJson, sendJsonText } from '../http/send-json.js';
import { DesignRequestSchema } from '../schemas/design-request-schema.js';
import {
  designContentJson,
  type DesignContent,
  type DesignRevisionRecord,
  type DesignStore,
} from '../stores/design-store.js';
import type { MaterialStore } from '../stores/material-store.js';

const revisionNumber = z.coerce.number().int().min(1).max(Number.MAX_SAFE_INTEGER);
const RevisionParamsSchema = z.object({ revision: revisionNumber });
const NetlistQuerySchema = z.object({
  revision: revisionNumber.optional(),
  corner: z.string().min(1).optional(),
});

const notFound = (what: string) =>
  new ProblemError(PROBLEM_TYPES.notFound, { detail: `no ${what}` });

/** What a revision stores of an evaluation: the design without its corners' waveforms. */
const storedContent = ({ spec, design, meta }: EvaluatedContent): DesignContent => ({
  spec,
  design: withoutWaveforms(design),
  meta,
});

/**
 * The view of a revision just stored from `evaluated`: its stored bytes, or with
 * `include=waveforms` the evaluation's own design, waveforms and all.
 */
function createdViewJson(
  record: DesignRevisionRecord,
  evaluated: EvaluatedContent,
  include: Included,
): Buffer<ArrayBuffer> {
  if (!include.waveforms) return designViewJson(record);
  return designViewJson({ ...record, contentJson: designContentJson(evaluated) });
}

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

  /**
   * The view of a stored revision: without waveforms its stored bytes (a revision stored before
   * waveforms became opt-in has them cut out); with `include=waveforms` its content with the
   * waveforms recomputed (409 when they cannot be: contentWithWaveforms).
   */
  async function storedViewJson(record: DesignRevisionRecord, include: Included, tenant: string) {
    if (include.waveforms) {
      const content = await contentWithWaveforms(record, { ...evaluating, tenant });
      return designViewJson({ ...record, contentJson: designContentJson(content) });
    }
    if (!jsonHasWaveforms(record.contentJson)) return designViewJson(record);
    const { spec, design, meta } = record;
    const contentJson = designContentJson({ spec, design: withoutWaveforms(design), meta });
    return designViewJson({ ...record, contentJson });
  }

  routes.post('/', async (c) => {
    const include = readInclude(c);
    const { spec } = await readJsonBody(c, DesignRequestSchema);
    const tenant = tenantOf(c);
    const evaluated = await evaluateSpec(spec, { ...evaluating, tenant });
    if (!evaluated.ok) throw infeasibleProblem(evaluated.issues);
    const record = await designs.create(tenant, storedContent(evaluated.value));
    return sendJsonText(c, 201, createdViewJson(record, evaluated.value, include), {
      location: `/v1/designs/${record.id}`,
    });
  });

  routes.get('/:id', async (c) => {
    const include = readInclude(c);
    const tenant = tenantOf(c);
    const record = await designs.latest(tenant, c.req.param('id'));
    if (!record) throw notFound(`design ${c.req.param('id')}`);
    return sendJsonText(c, 200, await storedViewJson(record, include, tenant));
  });

  routes.post('/:id/revisions', async (c) => {
    const id = c.req.param('id');
    const include = readInclude(c);
    const { spec } = await readJsonBody(c, DesignRequestSchema);
    // 404 before evaluating: a missing design outranks anything wrong with the spec.
    const tenant = tenantOf(c);
    if (!(await designs.listRevisions(tenant, id))) throw notFound(`design ${id}`);
    const evaluated = await evaluateSpec(spec, { ...evaluating, tenant });
    if (!evaluated.ok) throw infeasibleProblem(evaluated.issues);
    const record = await designs.appendRevision(tenant, id, storedContent(evaluated.value));
    if (!record) throw notFound(`design ${id}`);
    const location = `/v1/designs/${record.id}/revisions/${record.revision}`;
    return sendJsonText(c, 201, createdViewJson(record, evaluated.value, include), { location });
  });

  routes.get('/:id/revisions', async (c) => {
    const items = await designs.listRevisions(tenantOf(c), c.req.param('id'));
    if (!items) throw notFound(`design ${c.req.param('id')}`);
    return sendJson(c, 200, { items });
  });

  routes.get('/:id/revisions/:revision', async (c) => {
    const { revision } = readParams(c.req.param(), RevisionParamsSchema);
    const include = readInclude(c);
    const tenant = tenantOf(c);
    const record = await designs.revision(tenant, c.req.param('id'), revision);
    if (!record) throw notFound(`revision ${revision} of design ${c.req.param('id')}`);
    return sendJsonText(c, 200, await storedViewJson(record, include, tenant));
  });

  routes.get('/:id/netlist', async (c) => {
    const id = c.req.param('id');
    const { revision, corner } = readParams(c.req.query(), NetlistQuerySchema);
    const tenant = tenantOf(c);
    const record =
      revision === undefined
        ? await designs.latest(tenant, id)
        : await designs.revision(tenant, id, revision);
    if (!record)
      throw notFound(`design ${id}${revision === undefined ? '' : ` revision ${revision}`}`);
    checkCornerLabel(record.design, corner);
    // Some topologies' decks start from the waveforms' values: recomputed as for include=waveforms.
    const content = await contentWithWaveforms(record, { ...evaluating, tenant });
    return c.text(netlistText(content, corner), 200, {
      'content-type': 'text/plain; charset=utf-8',
    });
  });

  return routes;
}
