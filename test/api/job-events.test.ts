import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { startApiTestApp, type ApiTestApp } from '../helpers/api-test-app.js';

let api: ApiTestApp;
beforeAll(async () => {
  api = await startApiTestApp();
});
afterAll(async () => {
  await api.close();
});

/** The events of a server-sent event stream: name, id and parsed data. */
function parseEvents(text: string): { event: string; id: string; data: Record<string, unknown> }[] {
  return text
    .split('\n\n')
    .filter((block) => block.split('\n').some((line) => line.startsWith('data:')))
    .map((block) => {
      const field = (name: string) =>
        block
          .split('\n')
          .filter((line) => line.startsWith(`${name}:`))
          .map((line) => line.slice(name.length + 1).trim())
          .join('\n');
      return { event: field('event'), id: field('id'), data: JSON.parse(field('data')) };
    });
}

// Invented scenario: the packaging-machine supply swept over 400 input voltages, enough points
// for the stream to see the job while it runs.
const sweep = {
  kind: 'sweep',
  input: {
    spec: EXAMPLE_SPECS.packagingAux,
    grid: { inputVoltagesV: Array.from({ length: 400 }, (_, index) => 36 + index * 0.09) },
  },
};

describe('GET /v1/jobs/{id}/events', () => {
  it('streams progress events whose done never falls, then one end event, and closes', async () => {
    const submitted = await api.http.post('/v1/jobs').send(sweep);
    expect(submitted.status).toBe(202);
    const response = await api.http.get(`/v1/jobs/${submitted.body.id}/events`);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toContain('text/event-stream');
    const events = parseEvents(response.text);
    const progress = events.filter((event) => event.event === 'progress');
    expect(progress.length).toBeGreaterThanOrEqual(1);
    const done = progress.map((event) => (event.data.progress as { done: number }).done);
    expect(done).toEqual([...done].sort((a, b) => a - b));
    for (const event of progress) expect(event.data).not.toHaveProperty('result');
    expect(events.at(-1)).toMatchObject({ event: 'end', data: { state: 'completed' } });
    expect(progress.at(-1)?.data).toMatchObject({ state: 'completed' });
    const ids = events.map((event) => Number(event.id));
    expect(ids).toEqual(ids.map((_, index) => index + 1));
  });

  it('answers 404 problem+json for an unknown job', async () => {
    const response = await api.http.get('/v1/jobs/00000000-0000-4000-8000-000000000000/events');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toContain('application/problem+json');
  });
});
