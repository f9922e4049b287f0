import { request as httpRequest } from 'node:http';
import { afterEach, describe, expect, it } from 'vitest';
import { issueKey } from '../../api/auth/api-key.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { startApiServerProcess, type TestApiServerProcess } from '../helpers/api-server-process.js';

// The process as `npm start` runs it: its start-up lines, its key, and its graceful shutdown on
// SIGTERM (issue 6: the API stops accepting, lets requests in flight finish, exits 0).

let server: TestApiServerProcess | undefined;
afterEach(async () => {
  await server?.stop('SIGKILL');
  server = undefined;
});

async function startServer(env: Record<string, string>) {
  server = await startApiServerProcess(env);
  return server;
}

describe('the server process (npm start)', () => {
  it('prints a local admin key at start-up that works, and writes JSON log lines', async () => {
    const { port, lines } = await startServer({});
    const keyLine = lines.find((line) => typeof line['key'] === 'string');
    expect(keyLine).toMatchObject({ level: 'info', tenant: 'local' });
    const key = String(keyLine?.['key']);
    const url = `http://127.0.0.1:${port}/v1/catalog/wires`;
    expect((await fetch(url)).status).toBe(401);
    expect((await fetch(url, { headers: { authorization: `Bearer ${key}` } })).status).toBe(200);
  });

  it('on SIGTERM finishes the request in flight, refuses new connections and exits 0', async () => {
    const { token } = issueKey();
    const { port, lines, child } = await startServer({ LOCAL_API_KEY: token });
    const body = JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux });
    // The request is sent in two parts around the signal, so it is surely in flight then.
    const request = httpRequest({
      host: '127.0.0.1',
      port,
      method: 'POST',
      path: '/v1/designs',
      headers: {
        authorization: `Bearer ${token}`,
        'content-type': 'application/json',
        'content-length': Buffer.byteLength(body),
      },
    });
    const answered = new Promise<number>((resolve, reject) => {
      request.on('response', (response) => {
        response.resume();
        resolve(response.statusCode ?? 0);
      });
      request.on('error', reject);
    });
    request.write(body.slice(0, 20));
    await new Promise((resolve) => setTimeout(resolve, 300));
    const exited = new Promise<number | null>((resolve) => child.once('exit', resolve));
    child.kill('SIGTERM');
    await new Promise((resolve) => setTimeout(resolve, 300));
    request.end(body.slice(20));
    expect(await answered).toBe(201);
    expect(await exited).toBe(0);
    expect(lines.some((line) => line['msg'] === 'shutting down')).toBe(true);
    await expect(fetch(`http://127.0.0.1:${port}/healthz`)).rejects.toThrow();
  });
});
