import { Hono } from 'hono';
import { z } from 'zod';
import { CORE_SHAPE_FAMILIES } from '../../solvers/index.js';
import { coreShapeList } from '../catalog/core-shape-list.js';
import { readParams } from '../http/read-params.js';
import { sendJson } from '../http/send-json.js';

const CoreShapeQuerySchema = z.object({ family: z.enum(CORE_SHAPE_FAMILIES).optional() });

/** /v1/catalog/core-shapes: the standard core shapes the engine knows, with their geometry. */
export function coreShapeRoutes(): Hono {
  return new Hono().get('/', (c) => {
    const { family } = readParams(c.req.query(), CoreShapeQuerySchema);
    return sendJson(c, 200, coreShapeList(family));
  });
}
