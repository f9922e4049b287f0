/**
 * Thrown by JobRunner.submit when the job's owner already has `limit` unfinished jobs (the
 * `ownerUnfinishedMax` of SubmitOptions): the job was not accepted. `unfinished` is the owner's
 * count of unfinished jobs as the check saw it.
 */
export class JobQuotaError extends Error {
  override readonly name = 'JobQuotaError';

  constructor(
    readonly owner: string,
    readonly unfinished: number,
    readonly limit: number,
  ) {
    super(`owner ${owner} has ${unfinished} unfinished jobs; at most ${limit} are allowed`);
  }
}
