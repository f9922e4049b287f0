/**
 * The cancellation protocol the BullMQ producer and the worker processes share.
 *
 * - A waiting job is removed from the queue and a cancelled record is left at `recordKey(id)`.
 * - For an active job the producer sets `markKey(id)` and publishes the id on `channel`; the
 *   worker holding the job aborts its handler (it also reads the mark when the job starts, on
 *   every progress report and before completing, so a lost message only delays the abort). The
 *   job then fails with CANCELLED_FAILURE_REASON as an UnrecoverableError, and the producer
 *   maps that reason to the 'cancelled' state.
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
