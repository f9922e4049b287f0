import cluster, { type Worker } from 'node:cluster';
import type { AppConfig } from './config.js';
import { serveClusterMetrics } from './observability/cluster-metrics.js';
import { createLogger } from './observability/logger.js';

/**
 * The primary of API_PROCESSES processes (node:cluster): it forks them (each runs serveApi on
 * the Redis backend; the primary hands out connections and serves nothing itself), says once
 * that the service listens when every one of them does, and on SIGTERM or SIGINT passes the
 * signal on, waits for every process to finish its requests in flight and exits 0 (1 when one
 * of them failed). A process that dies while the service runs is replaced; one that dies
 * before it ever listened (a port in use, say) stops the whole service with exit code 1, since
 * its replacement would fail alike. It also merges every process's metrics for /metrics.
 */
export function runClusterPrimary(config: AppConfig): void {
  const logger = createLogger({ level: config.logLevel });
  const alive = new Map<number, Worker>();
  const listening = new Set<number>();
  let isStopping = false;
  let isAnnounced = false;
  let exitCode = 0;

  const fork = () => {
    const worker = cluster.fork();
    alive.set(worker.id, worker);
  };
  const stop = (signal: NodeJS.Signals) => {
    if (isStopping) return;
    isStopping = true;
    logger.info({ msg: 'shutting down', signal, processes: alive.size });
    for (const worker of alive.values()) worker.process.kill(signal);
  };

  cluster.on('listening', (worker: Worker, address) => {
    listening.add(worker.id);
    if (isAnnounced || listening.size < config.apiProcesses) return;
    isAnnounced = true;
    const host = address.addressType === 6 ? `[${address.address}]` : address.address;
    logger.info({
      msg: `design service listening on http://${host}:${address.port} (${config.apiProcesses} API processes)`,
      processes: config.apiProcesses,
    });
  });
  cluster.on('exit', (worker: Worker, code, signal) => {
    alive.delete(worker.id);
    const wasListening = listening.delete(worker.id);
    if (isStopping) {
      // A process stopped by the signal before it could set its handler has nothing in flight.
      if (code !== 0 && code !== null) exitCode = 1;
    } else if (!wasListening) {
      logger.fatal({
        msg: 'an API process failed before it listened: stopping the service',
        pid: worker.process.pid,
        code,
        signal,
      });
      exitCode = 1;
      stop('SIGTERM');
    } else {
      logger.error({
        msg: 'an API process died: starting another',
        pid: worker.process.pid,
        code,
        signal,
      });
      fork();
    }
    if (isStopping && alive.size === 0) process.exit(exitCode);
  });
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
  // /metrics of any process answers for all of them, merged here.
  serveClusterMetrics();

  for (let i = 0; i < config.apiProcesses; i++) fork();
}
