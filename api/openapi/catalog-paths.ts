import type { PathsObject } from 'openapi3-ts/oas31';
import { CORE_SHAPE_FAMILIES, MATERIAL_CLASSES } from '../../solvers/index.js';
import { EXAMPLE_IDS } from './example-ids.js';
import { EXAMPLE_MATERIALS } from './example-materials.js';
import { example } from './example.js';
import { jsonResponse, problemResponses } from './responses.js';

const builtInId = MATERIAL_CLASSES[0]?.id ?? '';
const { labFerrite, twoPoints, oneFrequency } = EXAMPLE_MATERIALS;

const SHARED = `User materials belong to the caller's tenant: other tenants neither see nor use them, and may reuse their names.`;

const awgParameter = (name: 'awgMin' | 'awgMax', description: string) => ({
  name,
  in: 'query' as const,
  description,
  schema: { type: 'integer' as const, minimum: -3, maximum: 56 },
});

/** The /v1/catalog paths: core shapes, materials (built-in and user), round wire. */
export function catalogPaths(): PathsObject {
  return {
    '/v1/catalog/core-shapes': {
      get: {
        operationId: 'listCoreShapes',
        tags: ['catalog'],
        summary: 'Standard core shapes with their computed effective parameters',
        description:
          'Nominal dimensions (m) of each shape, recalled from the standard shape families, and the geometry computed from them: IEC 60205 le, Ae, Ve, Amin, window area and breadth, mean turn length, cooling surface. Confirm every dimension against your supplier’s drawing.',
        parameters: [
          {
            name: 'family',
            in: 'query',
            description: `Only shapes of this family (${CORE_SHAPE_FAMILIES.join(', ')}); another value gets 400 naming the valid ones.`,
            schema: { type: 'string', enum: [...CORE_SHAPE_FAMILIES] },
            examples: {
              'etd-only': example('the ETD family', 'etd', 200),
              'unknown-family': example('a family the catalog does not have', 'rm', 400),
            },
          },
        ],
        responses: {
          '200': jsonResponse('The shapes.', 'CoreShapeList'),
          ...problemResponses(400),
        },
      },
    },
    '/v1/catalog/materials': {
      get: {
        operationId: 'listMaterials',
        tags: ['catalog'],
        summary: 'Built-in generic material classes and user materials',
        description: `Built-in classes (origin built-in) carry invented, representative numbers. ${SHARED}`,
        responses: {
          '200': jsonResponse('The materials.', 'MaterialList'),
          ...problemResponses(503),
        },
      },
      post: {
        operationId: 'createMaterial',
        tags: ['catalog'],
        summary: 'Add a material from measured loss points; the service fits its Steinmetz law',
        description: `Fits Pv = k·f^α·B^β to the points by least squares on log10 Pv and stores the material with its fit error. Fewer than 3 points, or points that do not vary both frequency and flux density, get 422 with the engine issue. A name already used (ignoring case, built-in ids included) gets 409. ${SHARED}`,
        requestBody: {
          required: true,
          content: {
            'application/json': {
              schema: { $ref: '#/components/schemas/MaterialRequest' },
              examples: {
                'lab-ferrite': example(
                  'invented: eight loss points of a made-up lab ferrite',
                  labFerrite,
                  201,
                ),
                'built-in-name': example(
                  `invented: the lab ferrite's points under the built-in name ${builtInId}`,
                  { ...labFerrite, name: builtInId },
                  409,
                ),
                'two-points': example('invented: two points, too few to fit', twoPoints, 422),
                'one-frequency': example(
                  'invented: three points at one frequency; α and β cannot be told apart',
                  oneFrequency,
                  422,
                ),
                'negative-loss': example(
                  'invented: a loss point with a negative loss density',
                  {
                    name: 'invented-bad-point-ferrite',
                    lossPoints: [{ ...labFerrite.lossPoints[0], lossDensityWPerM3: -1 }],
                  },
                  400,
                ),
              },
            },
          },
        },
        responses: {
          '201': jsonResponse('The new material with its fit.', 'UserMaterial', {
            isCreated: true,
          }),
          ...problemResponses(400, 409, 413, 415, 422, 503),
        },
      },
    },
    '/v1/catalog/materials/{id}': {
      get: {
        operationId: 'getMaterial',
        tags: ['catalog'],
        summary: 'One material: a built-in class by its id, or a user material by its UUID',
        parameters: [
          {
            name: 'id',
            in: 'path',
            required: true,
            description: 'A built-in class id, or the id POST /v1/catalog/materials returned.',
            schema: { type: 'string' },
            examples: {
              'built-in': example(`the built-in class ${builtInId}`, builtInId, 200),
              unknown: example('an id no material has', EXAMPLE_IDS.unknown, 404),
            },
          },
        ],
        responses: {
          '200': jsonResponse('The material.', 'Material'),
          ...problemResponses(404, 503),
        },
      },
    },
    '/v1/catalog/wires': {
      get: {
        operationId: 'listWires',
        tags: ['catalog'],
        summary: 'Round enamelled copper magnet wire by AWG',
        description:
          'Bare diameter by ASTM B258, copper area, DC resistance per metre at 20 °C (annealed copper, IEC 60028) and an approximate overall diameter for each enamel grade, thickest gauge first. Bounds outside −3…56 (−3 is 0000), or awgMin above awgMax, get 400.',
        parameters: [
          {
            ...awgParameter(
              'awgMin',
              'Thickest gauge listed (smallest AWG number); −3 when omitted.',
            ),
            examples: {
              'common-range': example('AWG 20 to 30', 20, 200),
              reversed: example('awgMin above awgMax', 30, 400),
            },
          },
          {
            ...awgParameter(
              'awgMax',
              'Thinnest gauge listed (largest AWG number); 56 when omitted.',
            ),
            examples: {
              'common-range': example('AWG 20 to 30', 30, 200),
              reversed: example('awgMin above awgMax', 20, 400),
            },
          },
        ],
        responses: {
          '200': jsonResponse('The wires.', 'WireList'),
          ...problemResponses(400),
        },
      },
    },
  };
}
