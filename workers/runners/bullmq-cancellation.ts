/**
 * The cancellation protocol the BullMQ producer and the worker processes share. `id` is always
 * the job's (the flow parent's) id; its chunks answer to it.
 *
 * - A job none of whose chunks a worker holds is removed with its chunks, and a cancelled
 *   record is left at `recordKey(id)`.
 * - Otherwise the producer sets `markKey(id)`, publishes the id on `channel` and removes the
 *   chunks no worker has taken. A worker running a chunk of the job (or its reduce) aborts it;
 *   it also reads the mark when a chunk or reduce starts and on every progress report, so a lost
 *   message only delays the abort. The chunk fails with CANCELLED_FAILURE_REASON as an
 *   UnrecoverableError, which fails the parent (failParentOnFailure); the producer shows the
 *   failed child's reason for the parent and maps that reason to the 'cancelled' state.
 */
export interface BullmqCancellationKeys {
  /** Redis pub/sub channel carrying the ids of active jobs to cancel. */
  channel: string;
  /** Key of the cancel mark of an active job. */
  markKey(id: string): string;
  /** Key of the JSON JobRecord kept for a waiting job that was removed by cancellation. */
  recordKey(id: string): string;
}

/** The failure reason of a job stopped by cancellation; never used for anything else. */
export const CANCELLED_FAILURE_REASON = 'bullmq-runner:job-cancelled';

/** How long cancel marks and cancelled records live, ms (as long as finished jobs are kept). */
export const CANCELLATION_TTL_MS = 7 * 24 * 3600 * 1000;

/** The keys of the protocol for one queue, beside BullMQ's own (default prefix `bull`). */
export function bullmqCancellationKeys(queueName: string): BullmqCancellationKeys {
  const base = `bull:${queueName}:cancellation`;
  return {
    channel: `${base}:requests`,
    markKey: (id) => `${base}:mark:${id}`,
    recordKey: (id) => `${base}:record:${id}`,
  };
}
