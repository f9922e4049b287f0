import { Hono } from 'hono';
import type { Spec } from '../../solvers/index.js';
import { tenantOf } from '../auth/caller.js';
import type { JobRunner } from '../../workers/runners/job-runner.js';
import { JobQuotaError } from '../../workers/runners/job-quota-error.js';
import { infeasibleProblem } from '../errors/infeasible-problem.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { readJsonBody } from '../http/read-json-body.js';
import { sendJson } from '../http/send-json.js';
import { jobView } from '../jobs/job-view.js';
import { sendJobResult } from '../jobs/send-job-result.js';
import { streamJobEvents } from '../jobs/stream-job-events.js';
import type { JobLimits } from '../jobs/submit-job.js';
import { submitJob } from '../jobs/submit-job.js';
import { JobRequestSchema, type JobRequest } from '../schemas/job-request-schema.js';
import { resolveSpecMaterial } from '../designs/resolve-spec-material.js';
import type { MaterialStore } from '../stores/material-store.js';

const notFound = (id: string) =>
  new ProblemError(PROBLEM_TYPES.notFound, { detail: `no job ${id}` });

/**
 * The job `id` if the caller's tenant owns it; another tenant's job is as absent as an unknown
 * one (404, same answer), so ids leak nothing.
 */
async function ownJob(jobs: JobRunner, id: string, tenant: string) {
  const record = await jobs.get(id);
  if (!record || record.owner !== tenant) throw notFound(id);
  return record;
}

/** A job input with a spec (the sweep's; any kind's that has one) gets its user material inline. */
async function withResolvedMaterial(
  sent: JobRequest,
  materials: MaterialStore,
  tenant: ReturnType<typeof tenantOf>,
): Promise<JobRequest> {
  const input = sent.input as { spec?: Spec };
  if (typeof input.spec !== 'object' || input.spec === null) return sent;
  const { spec } = await resolveSpecMaterial(input.spec, materials, tenant, {
    issuePath: ['spec'],
    bodyPath: ['input', 'spec'],
  });
  return { ...sent, input: { ...input, spec } } as JobRequest;
}

/**
 * /v1/jobs: submit heavy work (a user material its spec names put inline first, as for a
 * design), poll or stream its progress, read its result (JSON or CSV), cancel it.
 */
export function jobRoutes({
  jobs,
  limits,
  materials,
  jobsPerTenantMax,
  retryAfterS,
}: {
  jobs: JobRunner;
  limits: JobLimits;
  materials: MaterialStore;
  /** Unfinished jobs one tenant may have at once. */
  jobsPerTenantMax: number;
  /** Seconds a tenant at its job quota is told to wait. */
  retryAfterS: number;
}): Hono {
  const routes = new Hono();

  routes.post('/', async (c) => {
    const sent = await readJsonBody(c, JobRequestSchema);
    const tenant = tenantOf(c);
    const request = await withResolvedMaterial(sent, materials, tenant);
    // The runner counts the tenant's unfinished jobs and admits this one in one step, so
    // concurrent submissions (from any API process) never take more than the quota.
    const submitted = await submitJob(jobs, request, limits, {
      owner: tenant,
      ownerUnfinishedMax: jobsPerTenantMax,
    }).catch((error: unknown) => {
      if (!(error instanceof JobQuotaError)) throw error;
      throw new ProblemError(PROBLEM_TYPES.tooManyJobs, {
        detail: `tenant ${tenant} has ${error.unfinished} unfinished jobs; at most ${jobsPerTenantMax} may be queued or running at once`,
        retryAfterS,
      });
    });
    if (!submitted.ok) throw infeasibleProblem(submitted.issues);
    const view = jobView(submitted.value);
    return sendJson(c, 202, view, { location: view.links.self });
  });

  routes.get('/:id', async (c) => {
    const record = await ownJob(jobs, c.req.param('id'), tenantOf(c));
    return sendJson(c, 200, jobView(record));
  });

  routes.get('/:id/result', async (c) => {
    const record = await ownJob(jobs, c.req.param('id'), tenantOf(c));
    return sendJobResult(c, record);
  });

  routes.get('/:id/events', async (c) => {
    const record = await ownJob(jobs, c.req.param('id'), tenantOf(c));
    return streamJobEvents(c, jobs, record);
  });

  routes.delete('/:id', async (c) => {
    const id = c.req.param('id');
    await ownJob(jobs, id, tenantOf(c));
    const outcome = await jobs.cancel(id);
    if (outcome === 'not-found') throw notFound(id);
    if (outcome === 'already-finished') {
      throw new ProblemError(PROBLEM_TYPES.jobFinished, {
        detail: `job ${id} has already finished; only queued or running jobs can be cancelled`,
      });
    }
    const record = await jobs.get(id);
    if (!record) throw notFound(id);
    return sendJson(c, 200, jobView(record));
  });

  return routes;
}
