import { Counter, Gauge, Histogram, Registry, collectDefaultMetrics } from 'prom-client';
import type { JobRecord, JobRunner } from '../../workers/runners/job-runner.js';
import { clusterMetricsSource } from './cluster-metrics.js';

/** The service's Prometheus metrics, on a registry of their own (one per app). */
export interface ServiceMetrics {
  registry: Registry;
  /** Requests answered, by method, route pattern and status code. */
  httpRequests: Counter<'method' | 'route' | 'status'>;
  /** Time from request to response, s, by method and route pattern. */
  httpDuration: Histogram<'method' | 'route'>;
  /** Jobs that ended, by kind and final state (completed, failed, cancelled). */
  jobsFinished: Counter<'kind' | 'state'>;
  /** Time from a job's start to its end, s, by kind. */
  jobDuration: Histogram<'kind'>;
  /** CPU time the engine took to design the specs of design requests, s. */
  designEngineCpu: Counter;
  /**
   * The /metrics body (Prometheus text): this registry's, or in a cluster the whole service's,
   * every API process's registry merged (api/observability/cluster-metrics.ts).
   */
  scrape(): Promise<string>;
}

/** Duration buckets of the job histogram, s: 10 ms to 1 h. */
const JOB_BUCKETS_S = [0.01, 0.1, 0.5, 1, 5, 15, 60, 300, 900, 3600];

/** Latency buckets of the HTTP histogram, s: 1 ms to 10 s. */
const HTTP_BUCKETS_S = [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 10];

/**
 * Creates the metrics of one app. `processMetrics` adds the Node process's own (CPU, memory,
 * event-loop lag, garbage collection) with the `designservice_` prefix; off in tests that create
 * many apps. `clusterWorker`: this is one of API_PROCESSES processes, and /metrics answers for
 * all of them (the primary must run serveClusterMetrics). How series merge across processes:
 * request counts and latencies add up (each process answers its own requests); the job metrics
 * and the queue gauge take the largest value, since every API process follows the whole queue
 * on the Redis backend and so counts every job (a process started later has seen fewer).
 */
export function createServiceMetrics(
  options: { processMetrics?: boolean; clusterWorker?: boolean } = {},
): ServiceMetrics {
  const registry = new Registry();
  if (options.processMetrics ?? true) {
    collectDefaultMetrics({ register: registry, prefix: 'designservice_' });
  }
  return {
    registry,
    httpRequests: new Counter({
      name: 'designservice_http_requests_total',
      help: 'HTTP requests answered, by method, route pattern and status code.',
      labelNames: ['method', 'route', 'status'] as const,
      registers: [registry],
    }),
    httpDuration: new Histogram({
      name: 'designservice_http_request_duration_seconds',
      help: 'Time from request to response, s, by method and route pattern.',
      labelNames: ['method', 'route'] as const,
      buckets: HTTP_BUCKETS_S,
      registers: [registry],
    }),
    jobsFinished: new Counter({
      name: 'designservice_jobs_finished_total',
      help: 'Jobs that ended, by kind and final state (completed, failed, cancelled).',
      labelNames: ['kind', 'state'] as const,
      registers: [registry],
      aggregator: 'max',
    }),
    jobDuration: new Histogram({
      name: 'designservice_job_duration_seconds',
      help: "Time from a job's start to its end, s, by kind.",
      labelNames: ['kind'] as const,
      buckets: JOB_BUCKETS_S,
      registers: [registry],
      aggregator: 'max',
    }),
    designEngineCpu: new Counter({
      name: 'designservice_design_engine_cpu_seconds_total',
      help: 'CPU time the engine took to design the specs of POST /v1/designs and of new revisions (designConverter), s; the rest of those requests is the service around it.',
      registers: [registry],
    }),
    scrape: options.clusterWorker ? clusterMetricsSource(registry) : () => registry.metrics(),
  };
}

/** Counts an ended job and times it (from its start, or its creation if it never started). */
export function recordFinishedJob(metrics: ServiceMetrics, record: JobRecord): void {
  metrics.jobsFinished.inc({ kind: record.kind, state: record.state });
  const endMs = Date.parse(record.finishedAt ?? '');
  const startMs = Date.parse(record.startedAt ?? record.createdAt);
  if (Number.isFinite(endMs) && Number.isFinite(startMs) && endMs >= startMs) {
    metrics.jobDuration.observe({ kind: record.kind }, (endMs - startMs) / 1000);
  }
}

const QUEUE_GAUGE = 'designservice_queue_entries';

/**
 * Adds the queue-depth gauge, read from `jobs` at every scrape: entries waiting and running (jobs
 * on the embedded backend; jobs and their chunks on BullMQ). A backend that does not answer
 * leaves the gauge out of that scrape. Once per registry.
 */
export function watchQueue(metrics: ServiceMetrics, jobs: JobRunner): void {
  if (metrics.registry.getSingleMetric(QUEUE_GAUGE) !== undefined) return;
  new Gauge({
    name: QUEUE_GAUGE,
    help: 'Entries of the job queue waiting and running (jobs; on BullMQ also their chunks).',
    labelNames: ['state'] as const,
    registers: [metrics.registry],
    // Every API process reads the same queue: merged across a cluster, the largest, not the sum.
    aggregator: 'max',
    async collect() {
      const counts = await jobs.counts().catch(() => undefined);
      if (counts === undefined) return;
      this.set({ state: 'waiting' }, counts.waiting);
      this.set({ state: 'running' }, counts.running);
    },
  });
}
