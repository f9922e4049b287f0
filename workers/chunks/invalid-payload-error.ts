import type { JobKind } from '../runners/job-runner.js';

/** One field of a payload that failed its schema: the zod path and the schema's message. */
export interface PayloadFieldIssue {
  path: (string | number)[];
  message: string;
}

/**
 * Thrown by a job handler whose payload fails its schema. Retrying cannot help, so both runners
 * fail the job at once (the BullMQ worker rethrows it as bullmq's UnrecoverableError).
 */
export class InvalidPayloadError extends Error {
  override readonly name = 'InvalidPayloadError';
  readonly kind: JobKind;
  readonly issues: PayloadFieldIssue[];

  constructor(kind: JobKind, issues: PayloadFieldIssue[]) {
    const fields = issues.map((issue) => `${issue.path.join('.') || '(root)'}: ${issue.message}`);
    super(`invalid ${kind} payload: ${fields.join('; ')}`);
    this.kind = kind;
    this.issues = issues;
  }
}
