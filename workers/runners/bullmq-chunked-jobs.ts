import type { Redis } from 'ioredis';
import type { ChunkPlan } from '../../solvers/index.js';
import { CANCELLATION_TTL_MS } from './bullmq-cancellation.js';
import type { JobKind } from './job-runner.js';

/**
 * How a chunked job lives in BullMQ, shared by the producer and the worker processes.
 *
 * - A job is a flow: a parent job named after its kind, whose data is `ParentJobData`, with one
 *   child per chunk (named `chunk:<kind>`, id `<parent id>-chunk-<index>`, data `ChunkJobData`)
 *   on the same queue, each with `failParentOnFailure`. Workers take children as they come; the
 *   parent is processed once every child is done and reduces `getChildrenValues()`, each child
 *   having returned a `ChunkJobOutput`, sorted by chunk index.
 * - Progress lives in one Redis hash per job (`progressKey`): `done:<index>` holds the items a
 *   chunk has done (only ever raised, so a chunk run again after its worker died overwrites its
 *   own field and is never counted twice), `startedAtMs` the first chunk's start and
 *   `lastProgressAtMs` the latest report, both on Redis's clock (TIME), so workers on hosts with
 *   different clocks agree.
 */
export interface ParentJobData {
  /** The job's input as submitted (the parent decodes it again before it reduces). */
  request: unknown;
  /**
   * Items in the plan. The producer refuses an input that fails its schema, so a flow always has
   * its chunks; a worker still fails at once a parent whose input its own schema refuses (one
   * written by a producer of another version).
   */
  total: number;
  /** The submitting tenant. */
  owner?: string;
  /**
   * Longest one chunk may run, ms (the API's JOB_CHUNK_TIMEOUT_S when it was submitted), so
   * every worker applies the same limit to the job. Absent: no limit.
   */
  chunkTimeoutMs?: number;
}

/**
 * The data of one chunk's child job: the chunk alone. Its worker reads the request from the
 * parent (once per job, see bullmq-worker.ts), so a job of a thousand chunks stores its request
 * once, not a thousand times.
 */
export interface ChunkJobData {
  chunk: ChunkPlan;
}

/** What a chunk's child job returns: its index (getChildrenValues is keyed by job key) and output. */
export interface ChunkJobOutput {
  index: number;
  output: unknown;
}

const CHUNK_NAME_PREFIX = 'chunk:';

/** The job name of a chunk of a `kind` job. */
export function chunkJobName(kind: JobKind): string {
  return `${CHUNK_NAME_PREFIX}${kind}`;
}

/** What a BullMQ job name says: the parent of a `kind` job, or one of its chunks. */
export function parseJobName(name: string): { role: 'parent' | 'chunk'; kind: string } {
  return name.startsWith(CHUNK_NAME_PREFIX)
    ? { role: 'chunk', kind: name.slice(CHUNK_NAME_PREFIX.length) }
    : { role: 'parent', kind: name };
}

/** The id of a job's chunk `index` (custom BullMQ ids may not contain ':'). */
export function chunkJobId(parentId: string, index: number): string {
  return `${parentId}-chunk-${index}`;
}

/** The key of a job's progress hash, beside BullMQ's own keys of the queue. */
export function progressKey(queueName: string, parentId: string): string {
  return `bull:${queueName}:chunked:progress:${parentId}`;
}

/** The hash field holding chunk `index`'s items done. */
const doneField = (index: number) => `done:${index}`;

// KEYS: progress hash, cancel mark. ARGV: field, items done, TTL ms. Returns 1 when the job
// carries a cancel mark. One round trip per report: progress written and cancel read at once.
const REPORT_PROGRESS_LUA = `
local t = redis.call('TIME')
local nowMs = tonumber(t[1]) * 1000 + math.floor(tonumber(t[2]) / 1000)
redis.call('HSETNX', KEYS[1], 'startedAtMs', nowMs)
local old = tonumber(redis.call('HGET', KEYS[1], ARGV[1]) or '-1')
if tonumber(ARGV[2]) > old then redis.call('HSET', KEYS[1], ARGV[1], ARGV[2]) end
redis.call('HSET', KEYS[1], 'lastProgressAtMs', nowMs)
redis.call('PEXPIRE', KEYS[1], ARGV[3])
return redis.call('EXISTS', KEYS[2])
`;

/**
 * Records that chunk `index` of a job has done `done` items (0 at its start, which also sets the
 * job's start time) and answers whether the job has been cancelled.
 */
export async function reportChunkProgress(
  redis: Redis,
  keys: { progressKey: string; markKey: string },
  index: number,
  done: number,
): Promise<boolean> {
  const marked = await redis.eval(
    REPORT_PROGRESS_LUA,
    2,
    keys.progressKey,
    keys.markKey,
    doneField(index),
    String(done),
    String(CANCELLATION_TTL_MS),
  );
  return marked === 1;
}

/** A job's progress as the hash holds it: items done summed over its chunks, and the times. */
export interface StoredChunkProgress {
  done: number;
  startedAtMs?: number;
  lastProgressAtMs?: number;
}

/** Reads a job's progress hash (empty before any chunk has started). */
export function storedChunkProgress(fields: Record<string, string>): StoredChunkProgress {
  let done = 0;
  const progress: StoredChunkProgress = { done };
  for (const [field, value] of Object.entries(fields)) {
    if (field.startsWith('done:')) done += Number(value);
    else if (field === 'startedAtMs') progress.startedAtMs = Number(value);
    else if (field === 'lastProgressAtMs') progress.lastProgressAtMs = Number(value);
  }
  progress.done = done;
  return progress;
}
