import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS, INVALID_SPEC } from '../../api/openapi/example-specs.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp({ config: { bodyLimitBytes: 64 * 1024 } });
});
afterAll(async () => {
  await api.close();
});

const problemJson = /^application\/problem\+json/;

describe('problem responses', () => {
  it('POST /v1/designs with bad fields answers 400 listing each field by its array path', async () => {
    const response = await api.http.post('/v1/designs').send({ spec: INVALID_SPEC, extra: 1 });
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toMatch(problemJson);
    expect(response.body).toMatchInlineSnapshot(`
      {
        "detail": "3 invalid field(s): spec/outputs/0/voltageV, spec/switchingFrequencyHz, extra",
        "errors": [
          {
            "message": "Too small: expected number to be >0",
            "path": [
              "spec",
              "outputs",
              0,
              "voltageV",
            ],
          },
          {
            "message": "Invalid input: expected number, received undefined",
            "path": [
              "spec",
              "switchingFrequencyHz",
            ],
          },
          {
            "message": "unknown field",
            "path": [
              "extra",
            ],
          },
        ],
        "instance": "/v1/designs",
        "status": 400,
        "title": "Request body is invalid",
        "type": "tag:isolated-converter-design,2026:problem:invalid-body",
      }
    `);
  });

  it('POST /v1/designs with a wrong type and an unknown rectifier kind names both paths', async () => {
    const output = EXAMPLE_SPECS.packagingAux.outputs[0];
    const response = await api.http.post('/v1/designs').send({
      spec: {
        ...EXAMPLE_SPECS.packagingAux,
        inputVoltageMinV: '36',
        outputs: [output, { ...output, rectifier: { kind: 'valve' } }],
      },
    });
    expect(response.status).toBe(400);
    expect(response.body.errors.map((error: { path: unknown }) => error.path)).toEqual([
      ['spec', 'inputVoltageMinV'],
      ['spec', 'outputs', 1, 'rectifier', 'kind'],
    ]);
  });

  it('POST /v1/designs with a spec whose input range is out of order names the field the refinement flags', async () => {
    const response = await api.http
      .post('/v1/designs')
      .send({ spec: { ...EXAMPLE_SPECS.packagingAux, inputVoltageMaxV: 40 } });
    expect(response.status).toBe(400);
    expect(response.body.errors).toEqual([
      { path: ['spec', 'inputVoltageMaxV'], message: 'must be at least inputVoltageNominalV' },
    ]);
  });

  it('POST /v1/designs with malformed JSON answers 400 malformed-json', async () => {
    const response = await api.http
      .post('/v1/designs')
      .set('content-type', 'application/json')
      .send('{"spec": {"topology": "flyback",');
    expect(response.status).toBe(400);
    expect(response.headers['content-type']).toMatch(problemJson);
    expect({ ...response.body, detail: undefined }).toMatchInlineSnapshot(`
      {
        "detail": undefined,
        "instance": "/v1/designs",
        "status": 400,
        "title": "Request body is not JSON",
        "type": "tag:isolated-converter-design,2026:problem:malformed-json",
      }
    `);
    expect(response.body.detail).toMatch(/^body is not JSON: /);
  });

  it('POST /v1/designs with an empty JSON body answers 400, not 500', async () => {
    const response = await api.http.post('/v1/designs').set('content-type', 'application/json');
    expect(response.status).toBe(400);
  });

  it('POST /v1/designs with a text/plain body answers 415', async () => {
    const response = await api.http
      .post('/v1/designs')
      .set('content-type', 'text/plain')
      .send(JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux }));
    expect(response.status).toBe(415);
    expect(response.headers['content-type']).toMatch(problemJson);
    expect(response.body).toMatchInlineSnapshot(`
      {
        "detail": "send the body as application/json (got 'text/plain')",
        "instance": "/v1/designs",
        "status": 415,
        "title": "Unsupported Media Type",
        "type": "about:blank",
      }
    `);
  });

  it('POST /v1/designs with an application/*+json type is read as JSON', async () => {
    const response = await api.http
      .post('/v1/designs')
      .set('content-type', 'application/vnd.example+json; charset=utf-8')
      .send(JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux }));
    expect(response.status).toBe(201);
  });

  it('POST /v1/designs with a body over the configured limit answers 413', async () => {
    const padding = 'x'.repeat(api.config.bodyLimitBytes);
    const response = await api.http
      .post('/v1/designs')
      .set('content-type', 'application/json')
      .send(JSON.stringify({ spec: EXAMPLE_SPECS.packagingAux, padding }));
    expect(response.status).toBe(413);
    expect(response.headers['content-type']).toMatch(problemJson);
    expect(response.body).toMatchInlineSnapshot(`
      {
        "detail": "request bodies are limited to 65536 bytes",
        "instance": "/v1/designs",
        "status": 413,
        "title": "Content Too Large",
        "type": "about:blank",
      }
    `);
  });

  it('POST /v1/jobs with a chunked body over the limit answers 413 too', async () => {
    // Written in pieces with no content-length, so Node sends it chunked and the limit is
    // counted as the body streams in.
    const { port } = api.server.address() as AddressInfo;
    const status = await new Promise<number>((resolve, reject) => {
      const request = httpRequest(
        { host: '127.0.0.1', port, method: 'POST', path: '/v1/jobs' },
        (response) => {
          response.resume();
          resolve(response.statusCode ?? 0);
        },
      );
      request.on('error', reject);
      request.setHeader('content-type', 'application/json');
      request.setHeader('authorization', `Bearer ${api.token}`);
      const piece = '['.repeat(1024);
      for (let sent = 0; sent <= api.config.bodyLimitBytes; sent += piece.length)
        request.write(piece);
      request.end();
    });
    expect(status).toBe(413);
  });

  it('an unknown route answers 404 problem+json', async () => {
    const response = await api.http.get('/v2/nothing-here');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toMatch(problemJson);
    expect(response.body).toMatchInlineSnapshot(`
      {
        "detail": "nothing at GET /v2/nothing-here",
        "instance": "/v2/nothing-here",
        "status": 404,
        "title": "Not Found",
        "type": "about:blank",
      }
    `);
  });

  it('an unsupported method on a known path answers 405 problem+json, never a stack trace', async () => {
    const response = await api.http.put('/v1/designs');
    expect(response.status).toBe(405);
    expect(response.text).not.toMatch(/\bat .*\.ts:\d+/);
  });
});
