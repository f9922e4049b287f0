/**
 * The worker process (`npm run worker`): consumes the BullMQ queue with the shared job handlers.
 * Configured by the environment; logs one JSON line per job event to stdout.
 * Start as many as the load needs, on as many hosts, all pointed at the same Redis.
 */
import { z } from 'zod';
import type { WorkerEvent } from './bullmq-worker.js';
import { DEFAULT_QUEUE_NAME } from './runners/bullmq-settings.js';

const WorkerEnvSchema = z.object({
  REDIS_URL: z
    .string({ error: 'REDIS_URL is required (for example redis://localhost:6379)' })
    .regex(/^rediss?:\/\/\S+$/, 'REDIS_URL must be a redis:// or rediss:// URL'),
  QUEUE_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,100}$/, 'QUEUE_NAME must be 1-100 letters, digits, - or _')
    .default(DEFAULT_QUEUE_NAME),
  WORKER_CONCURRENCY: z.coerce.number().int().min(1).max(64).default(1),
  WORKER_SHUTDOWN_GRACE_MS: z.coerce.number().int().min(0).max(600_000).default(10_000),
});

function log(line: Record<string, unknown>) {
  process.stdout.write(`${JSON.stringify({ time: new Date().toISOString(), ...line })}\n`);
}

const parsed = WorkerEnvSchema.safeParse(process.env);
if (!parsed.success) {
  for (const issue of parsed.error.issues) {
    process.stderr.write(`worker: bad configuration: ${issue.path.join('.')}: ${issue.message}\n`);
  }
  process.exit(2);
}
const env = parsed.data;

// Loaded only once the configuration is known to be good, so a bad one is reported at once.
const { startBullmqWorker } = await import('./bullmq-worker.js');
const { JOB_COMPUTATIONS } = await import('../solvers/index.js');
const worker = startBullmqWorker({
  redisUrl: env.REDIS_URL,
  queueName: env.QUEUE_NAME,
  concurrency: env.WORKER_CONCURRENCY,
  shutdownGraceMs: env.WORKER_SHUTDOWN_GRACE_MS,
  computations: JOB_COMPUTATIONS,
  onEvent: (event: WorkerEvent) => log({ ...event, queue: env.QUEUE_NAME }),
});

let isShuttingDown = false;
function shutDown(signal: NodeJS.Signals) {
  if (isShuttingDown) return;
  isShuttingDown = true;
  log({ event: 'closing', signal, queue: env.QUEUE_NAME });
  worker.close().then(
    () => {
      log({ event: 'closed', queue: env.QUEUE_NAME });
      process.exit(0);
    },
    (error: unknown) => {
      log({ event: 'error', reason: error instanceof Error ? error.message : String(error) });
      process.exit(1);
    },
  );
}
process.on('SIGTERM', shutDown);
process.on('SIGINT', shutDown);
