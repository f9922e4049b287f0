import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { createLogger } from '../../api/observability/logger.js';
import { createServiceMetrics, recordFinishedJob } from '../../api/observability/metrics.js';
import { JOB_COMPUTATIONS } from '../../solvers/index.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

/** Collects the JSON lines a logger writes. */
function logCapture(): { stream: Writable; lines: Array<Record<string, unknown>> } {
  const lines: Array<Record<string, unknown>> = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const line of chunk.toString().split('\n')) {
        if (line.trim() !== '') lines.push(JSON.parse(line) as Record<string, unknown>);
      }
      done();
    },
  });
  return { stream, lines };
}

let api: ApiTestApp;
const capture = logCapture();
beforeAll(async () => {
  const metrics = createServiceMetrics({ processMetrics: true });
  api = await startApiTestApp({
    logger: createLogger({ level: 'info', destination: capture.stream }),
    metrics,
    jobs: createInProcessRunner({
      computations: JOB_COMPUTATIONS,
      onFinished: (record) => recordFinishedJob(metrics, record),
    }),
  });
});
afterAll(async () => {
  await api.close();
});

describe('request ids and access log', () => {
  it('every response carries an x-request-id, a UUID when the caller sends none', async () => {
    const response = await api.http.get('/healthz');
    expect(response.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });

  it("a caller's acceptable X-Request-Id is kept; an unsafe one is replaced", async () => {
    const kept = await api.http.get('/healthz').set('x-request-id', 'trace-42:a.b_c');
    expect(kept.headers['x-request-id']).toBe('trace-42:a.b_c');
    const unsafe = await api.http.get('/healthz').set('x-request-id', 'bad id\twith spaces');
    expect(unsafe.headers['x-request-id']).not.toBe('bad id\twith spaces');
    expect(unsafe.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('each request writes one JSON access line with its request id, route pattern and status', async () => {
    const created = await api.http
      .post('/v1/designs')
      .set('x-request-id', 'design-post-1')
      .send({ spec: EXAMPLE_SPECS.packagingAux });
    expect(created.status).toBe(201);
    const read = await api.http.get(`/v1/designs/${String(created.body.id)}`);
    expect(read.status).toBe(200);
    const post = capture.lines.find((line) => line['requestId'] === 'design-post-1');
    expect(post).toMatchObject({
      level: 'info',
      service: 'design-service',
      msg: 'request',
      method: 'POST',
      route: '/v1/designs',
      status: 201,
    });
    expect(typeof post?.['durationMs']).toBe('number');
    expect(Date.parse(String(post?.['time']))).not.toBeNaN();
    const get = capture.lines.find(
      (line) => line['requestId'] === read.headers['x-request-id'] && line['msg'] === 'request',
    );
    expect(get).toMatchObject({ route: '/v1/designs/:id', status: 200 });
  });

  it('an unknown path is logged under the route "unmatched", not its raw path', async () => {
    const response = await api.http.get('/no/such/thing');
    expect(response.status).toBe(404);
    const line = capture.lines.find((l) => l['requestId'] === response.headers['x-request-id']);
    expect(line).toMatchObject({ route: 'unmatched', path: '/no/such/thing', status: 404 });
  });
});

describe('GET /metrics', () => {
  it('exposes request counts and latency by route pattern in the Prometheus text format', async () => {
    await api.http.get('/healthz');
    const response = await api.http.get('/metrics');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/);
    const text = response.text;
    expect(text).toMatch(
      /^designservice_http_requests_total\{method="GET",route="\/healthz",status="200"\} [1-9]\d*$/m,
    );
    expect(text).toMatch(
      /^designservice_http_request_duration_seconds_bucket\{le="\+Inf",method="POST",route="\/v1\/designs"\} [1-9]\d*$/m,
    );
    // One label per route pattern: a design's id never becomes a label value.
    expect(text).toMatch(/route="\/v1\/designs\/:id"/);
    expect(text).not.toMatch(/route="\/v1\/designs\/[0-9a-f]{8}-/);
    // The engine's CPU time of the designs made above (the POST in the access-log test): some.
    const engineCpuS = Number(
      /^designservice_design_engine_cpu_seconds_total (\S+)$/m.exec(text)?.[1],
    );
    expect(engineCpuS).toBeGreaterThan(0);
    // The Node process's own metrics.
    expect(text).toMatch(/^designservice_process_resident_memory_bytes \d+/m);
  });
});

describe('job metrics', () => {
  it('counts finished jobs by kind and state, times them, and shows the queue depth', async () => {
    const submitted = await api.http.post('/v1/jobs').send({
      kind: 'sweep',
      input: { spec: EXAMPLE_SPECS.packagingAux, grid: { loadFractions: [0.5, 1] } },
    });
    expect(submitted.status).toBe(202);
    for (let i = 0; i < 500; i += 1) {
      const job = await api.http.get(`/v1/jobs/${String(submitted.body.id)}`);
      if (job.body.state === 'completed') break;
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    const text = (await api.http.get('/metrics')).text;
    expect(text).toMatch(
      /^designservice_jobs_finished_total\{kind="sweep",state="completed"\} 1$/m,
    );
    expect(text).toMatch(/^designservice_job_duration_seconds_count\{kind="sweep"\} 1$/m);
    expect(text).toMatch(/^designservice_queue_entries\{state="waiting"\} 0$/m);
    expect(text).toMatch(/^designservice_queue_entries\{state="running"\} 0$/m);
  });
});
