import cluster from 'node:cluster';
import { AggregatorRegistry, type Registry } from 'prom-client';

// /metrics of a service of API_PROCESSES processes (node:cluster) answers for the whole service:
// whichever process takes the scrape asks the primary, the primary collects every process's
// registry (prom-client's AggregatorRegistry, over the cluster's IPC channel) and merges them
// by each metric's `aggregator` (counters and histograms summed by default), and the answer
// goes back the same way. Without it each process would answer with its own counters, a share
// that depends on which connection the scraper got.

const REQUEST = 'designservice:cluster-metrics-request';
const REPLY = 'designservice:cluster-metrics-reply';

/** Longest wait for every process's metrics, ms (prom-client gives up after 5 s itself). */
const CLUSTER_METRICS_TIMEOUT_MS = 6_000;

interface MetricsRequest {
  type: typeof REQUEST;
  id: number;
}

interface MetricsReply {
  type: typeof REPLY;
  id: number;
  text?: string;
  error?: string;
}

const isMessage = <T extends { type: string }>(message: unknown, type: T['type']): message is T =>
  typeof message === 'object' && message !== null && (message as { type?: unknown }).type === type;

/**
 * In the cluster's primary: answers every API process's request for the whole service's
 * metrics with the aggregation of all their registries (Prometheus text), or the reason it
 * failed (a process that does not answer within 5 s).
 */
export function serveClusterMetrics(): void {
  const aggregator = new AggregatorRegistry();
  cluster.on('message', (worker, message: unknown) => {
    if (!isMessage<MetricsRequest>(message, REQUEST)) return;
    const reply = (fields: Pick<MetricsReply, 'text' | 'error'>) => {
      if (worker.isConnected()) worker.send({ type: REPLY, id: message.id, ...fields });
    };
    aggregator.clusterMetrics().then(
      (text) => reply({ text }),
      (error: unknown) => reply({ error: (error as Error).message }),
    );
  });
}

/**
 * In an API process of the cluster: lets the primary read `registry`, and returns the function
 * that gives the whole service's metrics (Prometheus text) by asking the primary. It rejects
 * when the primary does not answer in time or reports a failure.
 */
export function clusterMetricsSource(registry: Registry): () => Promise<string> {
  // Constructing one adds prom-client's listener that hands this process's metrics to the primary.
  new AggregatorRegistry();
  AggregatorRegistry.setRegistries([registry]);
  const pending = new Map<
    number,
    { resolve: (text: string) => void; reject: (e: Error) => void }
  >();
  let nextId = 0;
  process.on('message', (message: unknown) => {
    if (!isMessage<MetricsReply>(message, REPLY)) return;
    const waiting = pending.get(message.id);
    if (waiting === undefined) return;
    pending.delete(message.id);
    if (message.text !== undefined) waiting.resolve(message.text);
    else waiting.reject(new Error(`cluster metrics: ${message.error ?? 'no answer'}`));
  });
  return () =>
    new Promise<string>((resolve, reject) => {
      const id = nextId++;
      const timer = setTimeout(() => {
        pending.delete(id);
        reject(new Error('cluster metrics: the primary did not answer in time'));
      }, CLUSTER_METRICS_TIMEOUT_MS);
      pending.set(id, {
        resolve: (text) => {
          clearTimeout(timer);
          resolve(text);
        },
        reject: (error) => {
          clearTimeout(timer);
          reject(error);
        },
      });
      process.send?.({ type: REQUEST, id } satisfies MetricsRequest);
    });
}
