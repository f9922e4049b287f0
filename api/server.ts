import cluster from 'node:cluster';
import { runClusterPrimary } from './cluster-primary.js';
import { ConfigError, loadConfig, type AppConfig } from './config.js';

// The process entry (`npm start`): reads the environment and serves the API in this process, or
// with API_PROCESSES above 1 (Redis backend only) forks that many API processes sharing the port
// (node:cluster) and shuts them all down gracefully on SIGTERM or SIGINT. A bad environment exits
// 1 with the variable named.

let config: AppConfig;
try {
  config = loadConfig();
} catch (error) {
  if (!(error instanceof ConfigError)) throw error;
  console.error(`design service: ${error.message}`);
  process.exit(1);
}

if (config.apiProcesses > 1 && cluster.isPrimary) {
  runClusterPrimary(config);
} else {
  // Loaded only here: the cluster's primary serves nothing and needs none of it.
  const { serveApi } = await import('./serve-api.js');
  await serveApi(config, { isClusterWorker: cluster.isWorker });
}
