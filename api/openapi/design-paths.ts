import type { ExampleObject, ParameterObject, PathsObject } from 'openapi3-ts/oas31';
import { EXAMPLE_IDS } from './example-ids.js';
import {
  EXAMPLE_SPECS,
  FIXED_INDUCTOR_SPEC,
  FOIL_WINDING_SPEC,
  HOT_SPOT_LIMIT_SPEC,
  INFEASIBLE_SPEC,
  INLINE_MATERIAL_SPEC,
  INVALID_SPEC,
  PQ_CORE_SPEC,
  RING_INDUCTOR_SPEC,
  UNKNOWN_MATERIAL_SPEC,
} from './example-specs.js';
import { example } from './example.js';
import { includeParameter } from './include-parameter.js';
import { jsonResponse, problemResponses } from './responses.js';

const designId = (examples: Record<string, ExampleObject>): ParameterObject => ({
  name: 'id',
  in: 'path',
  required: true,
  description: 'The design id POST /v1/designs returned.',
  schema: { type: 'string' },
  examples,
});

const STORED = `the id POST /v1/designs returned (${EXAMPLE_IDS.design} stands for it)`;
const storedDesign = (status: number) =>
  example(`a stored design: ${STORED}`, EXAMPLE_IDS.design, status);
const unknownDesign = example('an id no design has', EXAMPLE_IDS.unknown, 404);

const specBody = (examples: Record<string, ReturnType<typeof example>>) => ({
  required: true,
  content: {
    'application/json': { schema: { $ref: '#/components/schemas/DesignRequest' }, examples },
  },
});

const SPEC_EXAMPLES = {
  'packaging-aux': example(
    'invented: auxiliary supply for a packaging machine, 36–72 V in, 12 V 2 A out',
    { spec: EXAMPLE_SPECS.packagingAux },
    201,
  ),
  'logic-supply': example(
    'invented: logic supply on a 24 V machine bus, 18–32 V in, 5 V 3 A out, synchronous rectifier',
    { spec: EXAMPLE_SPECS.logicSupply },
    201,
  ),
  'conveyor-controls': example(
    'invented: 400 V bus supply for conveyor controls, 330–420 V in, 24 V 10 A out, two-switch forward',
    { spec: EXAMPLE_SPECS.conveyorControls },
    201,
  ),
  'sensor-rack': example(
    'invented: 48 V rack supply for sensor heads, 36–60 V in, 12 V 4 A out, forward with a reset winding',
    { spec: EXAMPLE_SPECS.sensorRack },
    201,
  ),
  'fan-shelf': example(
    'invented: 48 V telecom shelf fan and logic supply, 36–72 V in, 12 V 8 A out, active-clamp forward at D = 0.6',
    { spec: EXAMPLE_SPECS.fanShelf },
    201,
  ),
  'cab-display': example(
    'invented: 24 V vehicle-bus supply for a cab display, 18–36 V in, 12 V 10 A out, push-pull',
    { spec: EXAMPLE_SPECS.cabDisplay },
    201,
  ),
  'bench-loads': example(
    'invented: 400 V bus supply for test-bench loads, 360–410 V in, 24 V 20 A out, half bridge',
    { spec: EXAMPLE_SPECS.benchLoads },
    201,
  ),
  'kiln-controller': example(
    'invented: supply for a kiln controller, 300–400 V in, 48 V 10 A out, full bridge with a bridge rectifier',
    { spec: EXAMPLE_SPECS.kilnController },
    201,
  ),
  'inline-material': example(
    'invented: the packaging-machine supply on a material sent inline (invented numbers); a user material named by materialId is put inline like this',
    { spec: INLINE_MATERIAL_SPEC },
    201,
  ),
  'pq-core': example(
    'invented: the packaging-machine supply wound on a PQ 20/16 pair named by magnetics.coreShape',
    { spec: PQ_CORE_SPEC },
    201,
  ),
  'fixed-magnetics': example(
    'invented: the fan-shelf supply with its transformer and output inductor fixed in magnetics (the fields a design reports), evaluated without a search',
    { spec: FIXED_INDUCTOR_SPEC },
    201,
  ),
  'foil-windings': example(
    'invented: the fan-shelf supply on a PQ 20/20 pair with both windings fixed as copper foil (magnetics.wires)',
    { spec: FOIL_WINDING_SPEC },
    201,
  ),
  'ring-output-inductor': example(
    'invented: the fan-shelf supply with its output inductor on a ferrite ring whose gap would have to be cut',
    { spec: RING_INDUCTOR_SPEC },
    422,
  ),
  'hot-spot-limit': example(
    'invented: the packaging-machine supply on an EFD 20/10/7 pair with its winding hot spot held to 40 °C; the windings run hotter inside',
    { spec: HOT_SPOT_LIMIT_SPEC },
    422,
  ),
  'unknown-material': example(
    'invented: the packaging-machine supply naming a material id that is neither built in nor posted',
    { spec: UNKNOWN_MATERIAL_SPEC },
    422,
  ),
  'turns-ratio-too-high': example(
    'invented: the packaging-machine supply forced to turns ratio 6; 36 V in would need too large a duty cycle',
    { spec: INFEASIBLE_SPEC },
    422,
  ),
  'bad-fields': example(
    'invented: a negative output voltage and no switching frequency',
    { spec: INVALID_SPEC },
    400,
  ),
  'with-waveforms': example(
    'invented: the packaging-machine supply, answered with its waveforms (include=waveforms)',
    { spec: EXAMPLE_SPECS.packagingAux },
    201,
  ),
  'unknown-include': example(
    'invented: the packaging-machine supply with an include value the service does not know',
    { spec: EXAMPLE_SPECS.packagingAux },
    400,
  ),
};

const WITH_WAVEFORMS = (status: number) =>
  example("each corner's waveforms too", 'waveforms', status);
const UNKNOWN_INCLUDE = example('a part the service does not offer', 'everything', 400);

const WAVEFORMS_NOTE = " Each corner's `waveforms` only with include=waveforms.";

/** The /v1/designs paths of the OpenAPI document. */
export function designPaths(): PathsObject {
  return {
    '/v1/designs': {
      post: {
        operationId: 'createDesign',
        tags: ['designs'],
        summary: 'Evaluate a spec and store it as revision 1 of a new design',
        description:
          'Evaluates the spec inline (milliseconds). Feasible: 201 with the design, its provenance and a Location. Infeasible: 422 with the engine issues; nothing is stored. The revision is stored without waveforms; include=waveforms answers with them, from this evaluation.',
        parameters: [
          includeParameter(
            { 'with-waveforms': WITH_WAVEFORMS(201), 'unknown-include': UNKNOWN_INCLUDE },
            { stored: false },
          ),
        ],
        requestBody: specBody(SPEC_EXAMPLES),
        responses: {
          '201': jsonResponse(`The new design, revision 1.${WAVEFORMS_NOTE}`, 'DesignView', {
            isCreated: true,
          }),
          ...problemResponses(400, 413, 415, 422, 503),
        },
      },
    },
    '/v1/designs/{id}': {
      get: {
        operationId: 'getDesign',
        tags: ['designs'],
        summary: 'The latest revision of a design',
        parameters: [
          designId({
            stored: storedDesign(200),
            unknown: unknownDesign,
            'with-waveforms': storedDesign(200),
            'unknown-include': storedDesign(400),
          }),
          includeParameter(
            { 'with-waveforms': WITH_WAVEFORMS(200), 'unknown-include': UNKNOWN_INCLUDE },
            { stored: true },
          ),
        ],
        responses: {
          '200': jsonResponse(`The latest revision.${WAVEFORMS_NOTE}`, 'DesignView'),
          ...problemResponses(400, 404, 409, 503),
        },
      },
    },
    '/v1/designs/{id}/revisions': {
      post: {
        operationId: 'createDesignRevision',
        tags: ['designs'],
        summary: 'Evaluate a spec as the next immutable revision of a design',
        parameters: [
          designId({
            'packaging-aux': storedDesign(201),
            'turns-ratio-too-high': storedDesign(422),
            'unknown-design': unknownDesign,
            'with-waveforms': storedDesign(201),
          }),
          includeParameter({ 'with-waveforms': WITH_WAVEFORMS(201) }, { stored: false }),
        ],
        requestBody: specBody({
          'packaging-aux': SPEC_EXAMPLES['packaging-aux'],
          'turns-ratio-too-high': SPEC_EXAMPLES['turns-ratio-too-high'],
          'with-waveforms': SPEC_EXAMPLES['with-waveforms'],
          'unknown-design': example(
            'invented: the packaging-machine supply, sent to a design that does not exist',
            { spec: EXAMPLE_SPECS.packagingAux },
            404,
          ),
        }),
        responses: {
          '201': jsonResponse(`The new revision.${WAVEFORMS_NOTE}`, 'DesignView', {
            isCreated: true,
          }),
          ...problemResponses(400, 404, 413, 415, 422, 503),
        },
      },
      get: {
        operationId: 'listDesignRevisions',
        tags: ['designs'],
        summary: 'Every revision of a design, oldest first',
        parameters: [designId({ stored: storedDesign(200), unknown: unknownDesign })],
        responses: {
          '200': jsonResponse('The revisions.', 'RevisionList'),
          ...problemResponses(404, 503),
        },
      },
    },
    '/v1/designs/{id}/revisions/{revision}': {
      get: {
        operationId: 'getDesignRevision',
        tags: ['designs'],
        summary: 'One revision of a design',
        parameters: [
          designId({
            first: storedDesign(200),
            'not-a-number': storedDesign(400),
            later: storedDesign(404),
            'with-waveforms': storedDesign(200),
          }),
          {
            name: 'revision',
            in: 'path',
            required: true,
            description: 'Revision number, from 1.',
            schema: { type: 'integer', minimum: 1 },
            examples: {
              first: example('revision 1, which every design has', 1, 200),
              'not-a-number': example('not a revision number', 'latest', 400),
              later: example('a revision not made yet', 99, 404),
              'with-waveforms': example('revision 1', 1, 200),
            },
          },
          includeParameter({ 'with-waveforms': WITH_WAVEFORMS(200) }, { stored: true }),
        ],
        responses: {
          '200': jsonResponse(`The revision.${WAVEFORMS_NOTE}`, 'DesignView'),
          ...problemResponses(400, 404, 409, 503),
        },
      },
    },
    '/v1/designs/{id}/netlist': {
      get: {
        operationId: 'getDesignNetlist',
        tags: ['designs'],
        summary: 'A SPICE netlist of one operating corner of a design revision',
        description:
          "A plain-text netlist a general-purpose circuit simulator runs, to check the analytic results independently. Some topologies' decks start from the corner's waveforms, which a stored revision does not keep: the netlist is built from the design recomputed as for include=waveforms, and is 409 when that cannot be (a revision of another solver version).",
        parameters: [
          designId({
            'full-load': storedDesign(200),
            'unknown-corner': storedDesign(400),
            unknown: unknownDesign,
          }),
          {
            name: 'revision',
            in: 'query',
            description: 'Revision number; the latest when omitted.',
            schema: { type: 'integer', minimum: 1 },
            examples: { 'full-load': example('revision 1', 1, 200) },
          },
          {
            name: 'corner',
            in: 'query',
            description:
              'Label of the operating corner (one of design.corners[].label); the engine default when omitted. An unknown label gets 400 listing the valid ones.',
            schema: { type: 'string' },
            examples: {
              'full-load': example('lowest input at full load', 'min-input/100pct-load', 200),
              'unknown-corner': example('a label the design does not have', 'hottest-day', 400),
            },
          },
        ],
        responses: {
          '200': {
            description: 'The netlist.',
            content: { 'text/plain': { schema: { type: 'string' } } },
          },
          ...problemResponses(400, 404, 409, 503),
        },
      },
    },
  };
}
