import autocannon from 'autocannon';
import { issueKey } from '../../api/auth/api-key.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { spawn } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';

/** Requests per second and latency of one HTTP operation under load on loopback. */
export interface LoadFigures {
  label: string;
  requestsPerSecond: number;
  latencyP50Ms: number;
  latencyP99Ms: number;
  non2xx: number;
  errors: number;
}

// Invented scenario: the documented example, an imagined packaging machine's auxiliary supply.
const BODY = JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux });

/**
 * Loads POST /v1/designs on the embedded backend for `durationS` seconds. The service runs in its
 * own process (`tsx api/server.ts`, as `npm start` runs it), so the load generator in this process
 * does not share its event loop.
 */
export async function benchHttpDesigns(
  options: { durationS?: number; connections?: number } = {},
): Promise<LoadFigures> {
  const { durationS = 10, connections = 10 } = options;
  const port = await freePort();
  const { token } = issueKey();
  const server = spawn(process.execPath, ['--import', 'tsx', 'api/server.ts'], {
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      REDIS_URL: '',
      LOCAL_API_KEY: token,
      // The load comes from one key: lift the per-key limit so it measures the service.
      RATE_LIMIT_PER_MINUTE: '100000000',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  try {
    await new Promise<void>((resolve, reject) => {
      server.once('exit', (code) => reject(new Error(`server exited early with code ${code}`)));
      server.stdout.on('data', (chunk: Buffer) => {
        if (chunk.toString().includes('listening on')) resolve();
      });
    });
    const result = await autocannon({
      url: `http://127.0.0.1:${port}/v1/designs`,
      method: 'POST',
      headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
      body: BODY,
      connections,
      duration: durationS,
    });
    return {
      label: `POST /v1/designs, ${connections} connections, ${durationS} s`,
      requestsPerSecond: result.requests.average,
      latencyP50Ms: result.latency.p50,
      latencyP99Ms: result.latency.p99,
      non2xx: result.non2xx,
      errors: result.errors,
    };
  } finally {
    server.kill('SIGTERM');
  }
}

/** A TCP port that is free on the loopback interface right now. */
async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', () => resolve()));
  const { port } = probe.address() as AddressInfo;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  return port;
}
