import { Hono } from 'hono';
import { z } from 'zod';
import { tenantOf } from '../auth/caller.js';
import { designViewJson } from '../designs/design-view.js';
import { contentWithWaveforms } from '../designs/design-with-waveforms.js';
import { evaluateSpec } from '../designs/evaluate-spec.js';
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
import type { Spec } from '../../solvers/index.js';
import {
  designContentJson,
  encodedContent,
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

/** A new revision's content to store, and with `include=waveforms` its answer's content JSON. */
interface NewRevision {
  content: DesignContent;
  answerContentJson?: Buffer;
}

/**
 * Evaluates `spec` for a new revision: what the revision stores (the design without its
 * corners' waveforms) serialized now, and with `include=waveforms` the answer's content (the
 * evaluation's whole design) serialized too. Only those bytes, the spec and the meta outlive
 * this call: the engine's design, waveforms and all, is not held while the store works.
 * @throws ProblemError 422 when the engine finds the spec infeasible.
 */
async function evaluateNewRevision(
  spec: Spec,
  evaluating: Parameters<typeof evaluateSpec>[1],
  include: Included,
): Promise<NewRevision> {
  const evaluated = await evaluateSpec(spec, evaluating);
  if (!evaluated.ok) throw infeasibleProblem(evaluated.issues);
  const { design, meta } = evaluated.value;
  const content = encodedContent({
    spec: evaluated.value.spec,
    design: withoutWaveforms(design),
    meta,
  });
  if (!include.waveforms) return { content };
  return { content, answerContentJson: designContentJson(evaluated.value) };
}

/** The view of a revision just stored: its stored bytes, or the answer's content when given. */
const createdViewJson = (record: DesignRevisionRecord, { answerContentJson }: NewRevision) =>
  designViewJson(
    answerContentJson === undefined
      ? record
      : { id: record.id, revision: record.revision, contentJson: answerContentJson },
  );

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
    const created = await evaluateNewRevision(spec, { ...evaluating, tenant }, include);
    const record = await designs.create(tenant, created.content);
    return sendJsonText(c, 201, createdViewJson(record, created), {
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
    const created = await evaluateNewRevision(spec, { ...evaluating, tenant }, include);
    const record = await designs.appendRevision(tenant, id, created.content);
    if (!record) throw notFound(`design ${id}`);
    const location = `/v1/designs/${record.id}/revisions/${record.revision}`;
    return sendJsonText(c, 201, createdViewJson(record, created), { location });
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
