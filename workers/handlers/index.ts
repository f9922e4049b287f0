import type { JobHandler, JobKind } from '../runners/job-runner.js';
import { sweepJob } from './sweep.js';

/** The handler of every job kind; both runners and the worker process take this registry. */
export const JOB_HANDLERS: Record<JobKind, JobHandler> = {
  sweep: sweepJob,
};
