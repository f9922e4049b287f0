import type { PathsObject } from 'openapi3-ts/oas31';
import { EXAMPLE_COMPARISONS } from './example-comparisons.js';
import { example } from './example.js';
import { includeParameter } from './include-parameter.js';
import { jsonResponse, problemResponses } from './responses.js';

/** The /v1/comparisons path of the OpenAPI document. */
export function comparisonPaths(): PathsObject {
  return {
    '/v1/comparisons': {
      post: {
        operationId: 'compareTopologies',
        tags: ['comparisons'],
        summary: 'Design one spec with several topologies and rank the feasible ones',
        description:
          "Designs the spec inline with each candidate topology (every topology the service knows unless `topologies` names some), ranks the feasible designs by `rankBy` (nominal efficiency by default) and lists each infeasible topology with its issues. Always 200 for a valid request, even when no topology is feasible. Nothing is stored: to keep a design, POST the chosen entry's `spec` to /v1/designs. Each ranked design's corners come without their `waveforms` unless include=waveforms.",
        parameters: [
          includeParameter(
            {
              'with-waveforms': example("each corner's waveforms too", 'waveforms', 200),
              'unknown-include': example('a part the service does not offer', 'everything', 400),
            },
            { stored: false },
          ),
        ],
        requestBody: {
          required: true,
          content: {
            'application/json': {
              schema: { $ref: '#/components/schemas/ComparisonRequest' },
              examples: {
                'sensor-rack': example(
                  'invented: 48 V rack supply for sensor heads, 36–60 V in, 12 V 4 A out, every topology',
                  EXAMPLE_COMPARISONS.sensorRack,
                  200,
                ),
                'conveyor-hold-up': example(
                  'invented: 400 V bus supply for conveyor controls with 20 ms hold-up, ranked by largest loss; the single-switch topologies are rejected on switch voltage',
                  EXAMPLE_COMPARISONS.conveyorHoldUp,
                  200,
                ),
                'sensor-rack-forwards': example(
                  'invented: the sensor-rack supply, two forward variants only, ranked by switch voltage utilization',
                  EXAMPLE_COMPARISONS.sensorRackForwards,
                  200,
                ),
                'with-waveforms': example(
                  'invented: the sensor-rack supply, two forward variants, answered with their waveforms (include=waveforms)',
                  EXAMPLE_COMPARISONS.sensorRackForwards,
                  200,
                ),
                'unknown-include': example(
                  'invented: the sensor-rack supply, two forward variants, with an include value the service does not know',
                  EXAMPLE_COMPARISONS.sensorRackForwards,
                  400,
                ),
                'bad-fields': example(
                  'invented: an unknown ranking figure, an unknown topology and a hold-up end voltage above its start',
                  EXAMPLE_COMPARISONS.badFields,
                  400,
                ),
              },
            },
          },
        },
        responses: {
          '200': jsonResponse('The ranking and the rejected topologies.', 'Comparison'),
          ...problemResponses(400, 413, 415),
        },
      },
    },
  };
}
