import { z } from 'zod';
import { JOB_KINDS, type JobKind } from '../solvers/index.js';
import { DEFAULT_QUEUE_NAME } from '../workers/runners/bullmq-settings.js';
import { LOG_LEVELS, type LogLevel } from './observability/logger.js';

/** The service's settings, read once from the environment at start-up. */
export interface AppConfig {
  /** TCP port to listen on. */
  port: number;
  /** Interface to bind. */
  host: string;
  /** Redis URL; when absent the service runs the memory store and the in-process runner. */
  redisUrl?: string;
  /** Largest request body accepted, bytes; larger bodies get 413. */
  bodyLimitBytes: number;
  /**
   * Largest size (items of its plan: grid points, candidates, samples) a job of each kind may
   * have; a larger one gets 422 job_size_limit.
   */
  jobSizeLimits: Record<JobKind, number>;
  /** Jobs the in-process runner works on at once. */
  inProcessConcurrency: number;
  /**
   * Longest one chunk of a job may compute, s; past it the job fails (never retried). Stamped on
   * each job at submission, so every worker applies the same limit.
   */
  jobChunkTimeoutS: number;
  /** Seconds a client is told to wait (Retry-After) when a backend is down. */
  retryAfterS: number;
  /** BullMQ queue the API enqueues on; the workers' QUEUE_NAME must match. */
  queueName: string;
  /** How long a response to a request with an Idempotency-Key is replayed, s. */
  idempotencyTtlS: number;
  /** Unfinished jobs one tenant may have at once; one more gets 429 with Retry-After. */
  jobsPerTenantMax: number;
  /** Requests one API key may send per clock minute; more get 429 with Retry-After. */
  rateLimitPerMinute: number;
  /**
   * The embedded backend's API key (admin of tenant 'local'); a new one is made and printed at
   * start-up when unset. Ignored with REDIS_URL (keys live in Redis: `npm run keys`).
   */
  localApiKey?: string;
  /** Least severe level written to the JSON log ('silent' writes nothing). */
  logLevel: LogLevel;
  /**
   * API processes sharing the port (node:cluster); more than one needs `redisUrl`, since the
   * embedded backend keeps designs, keys and jobs in each process's own memory.
   */
  apiProcesses: number;
}

const integer = (min: number, max: number) =>
  z
    .string()
    .regex(/^\d+$/, { error: 'must be a whole number' })
    .transform(Number)
    .pipe(
      z
        .number()
        .min(min, { error: `must be at least ${min}` })
        .max(max, { error: `must be at most ${max}` }),
    );

/** The largest job size of a kind when neither its variable nor JOB_SIZE_LIMIT is set. */
const JOB_SIZE_LIMIT_DEFAULT = 1_000_000;

/**
 * Kinds whose own default differs: a sweep's result holds a row per point (about 250 bytes
 * each), so 100 000 points already make a 25 MB answer.
 */
const KIND_SIZE_LIMIT_DEFAULTS: Partial<Record<JobKind, number>> = { sweep: 100_000 };

/** The variable of one kind's size limit: JOB_SIZE_LIMIT_SWEEP, JOB_SIZE_LIMIT_CORE_SEARCH … */
export function jobSizeLimitVariable(kind: JobKind): string {
  return `JOB_SIZE_LIMIT_${kind.toUpperCase().replaceAll('-', '_')}`;
}

/** Most API processes API_PROCESSES may ask for. */
export const API_PROCESSES_MAX = 64;

/** Variables this version no longer reads, and what replaced them (named in the error). */
const RETIRED_VARIABLES: Record<string, string> = {
  SWEEP_POINT_LIMIT: 'JOB_SIZE_LIMIT_SWEEP',
};

const EnvSchema = z.object({
  PORT: integer(1, 65_535).default(8080),
  HOST: z.string().min(1, { error: 'must not be empty' }).default('127.0.0.1'),
  REDIS_URL: z
    .url({ protocol: /^rediss?$/, error: 'must be a redis:// or rediss:// URL' })
    .optional(),
  BODY_LIMIT_BYTES: integer(1, 1024 ** 3).default(1024 ** 2),
  JOB_SIZE_LIMIT: integer(1, 1_000_000_000).optional(),
  ...Object.fromEntries(
    JOB_KINDS.map((kind) => [jobSizeLimitVariable(kind), integer(1, 1_000_000_000).optional()]),
  ),
  IN_PROCESS_CONCURRENCY: integer(1, 1024).default(1),
  RETRY_AFTER_S: integer(1, 3600).default(5),
  JOB_CHUNK_TIMEOUT_S: integer(1, 86_400).default(300),
  QUEUE_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,100}$/, { error: 'must be 1-100 letters, digits, - or _' })
    .default(DEFAULT_QUEUE_NAME),
  IDEMPOTENCY_TTL_S: integer(1, 30 * 86_400).default(86_400),
  RATE_LIMIT_PER_MINUTE: integer(1, 100_000_000).default(600),
  JOBS_PER_TENANT_MAX: integer(1, 100_000).default(10),
  LOCAL_API_KEY: z
    .string()
    .regex(/^icd_[0-9a-f]{16}_[A-Za-z0-9_-]{43}$/, {
      error: 'must be a key as `npm run keys -- create` prints it (icd_<16 hex>_<43 base64url>)',
    })
    .optional(),
  LOG_LEVEL: z
    .enum(LOG_LEVELS, { error: `must be one of ${LOG_LEVELS.join(', ')}` })
    .default('info'),
  API_PROCESSES: integer(1, API_PROCESSES_MAX).default(1),
});

/**
 * The refusal of several API processes on the embedded backend: each process would hold its own
 * designs, keys, jobs and idempotency answers, so a design made through one process would be 404
 * through the next, and the printed key would work in one process only.
 */
function embeddedProcessesProblem(apiProcesses: number): string {
  return (
    `API_PROCESSES=${JSON.stringify(String(apiProcesses))}: more than one API process needs REDIS_URL ` +
    "(the embedded backend keeps designs, keys and jobs in each process's own memory, so they would " +
    'not be found through the other processes); set REDIS_URL or run one process'
  );
}

/** Thrown by loadConfig; its message names every bad variable, fit to print and exit. */
export class ConfigError extends Error {
  override name = 'ConfigError';
}

/**
 * Validates the environment and returns the settings with defaults filled in. Empty strings count
 * as unset. Throws ConfigError naming each bad variable and what it must be.
 */
export function loadConfig(env: Record<string, string | undefined> = process.env): AppConfig {
  const present = Object.fromEntries(
    Object.keys(EnvSchema.shape).map((name) => [name, env[name] === '' ? undefined : env[name]]),
  );
  const parsed = EnvSchema.safeParse(present);
  const retired = Object.entries(RETIRED_VARIABLES)
    .filter(([name]) => env[name] !== undefined && env[name] !== '')
    .map(([name, replacement]) => `${name} is no longer read: set ${replacement} instead`);
  const processes =
    parsed.success && parsed.data.API_PROCESSES > 1 && parsed.data.REDIS_URL === undefined
      ? [embeddedProcessesProblem(parsed.data.API_PROCESSES)]
      : [];
  if (!parsed.success || retired.length > 0 || processes.length > 0) {
    const lines = (parsed.error?.issues ?? []).map((issue) => {
      const name = String(issue.path[0]);
      return `${name}=${JSON.stringify(present[name])}: ${issue.message}`;
    });
    throw new ConfigError(
      `invalid environment: ${[...lines, ...retired, ...processes].join('; ')}`,
    );
  }
  const e = parsed.data;
  // A kind's own variable, else JOB_SIZE_LIMIT, else the kind's default.
  const kindLimits: Record<string, unknown> = e;
  const jobSizeLimits = Object.fromEntries(
    JOB_KINDS.map((kind) => {
      const own = kindLimits[jobSizeLimitVariable(kind)];
      const fallback = e.JOB_SIZE_LIMIT ?? KIND_SIZE_LIMIT_DEFAULTS[kind] ?? JOB_SIZE_LIMIT_DEFAULT;
      return [kind, typeof own === 'number' ? own : fallback];
    }),
  ) as Record<JobKind, number>;
  return {
    port: e.PORT,
    host: e.HOST,
    ...(e.REDIS_URL === undefined ? {} : { redisUrl: e.REDIS_URL }),
    bodyLimitBytes: e.BODY_LIMIT_BYTES,
    jobSizeLimits,
    inProcessConcurrency: e.IN_PROCESS_CONCURRENCY,
    jobChunkTimeoutS: e.JOB_CHUNK_TIMEOUT_S,
    retryAfterS: e.RETRY_AFTER_S,
    queueName: e.QUEUE_NAME,
    idempotencyTtlS: e.IDEMPOTENCY_TTL_S,
    rateLimitPerMinute: e.RATE_LIMIT_PER_MINUTE,
    jobsPerTenantMax: e.JOBS_PER_TENANT_MAX,
    ...(e.LOCAL_API_KEY === undefined ? {} : { localApiKey: e.LOCAL_API_KEY }),
    logLevel: e.LOG_LEVEL,
    apiProcesses: e.API_PROCESSES,
  };
}
