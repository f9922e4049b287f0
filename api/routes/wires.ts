import { Hono } from 'hono';
import { z } from 'zod';
import { AWG_MAX, AWG_MIN, roundWireCatalog } from '../../solvers/index.js';
import { CATALOG_NOTES } from '../catalog/catalog-notes.js';
import { readParams } from '../http/read-params.js';
import { sendJson } from '../http/send-json.js';

const awg = z.coerce.number().int().min(AWG_MIN).max(AWG_MAX);
const WireQuerySchema = z
  .object({ awgMin: awg.default(AWG_MIN), awgMax: awg.default(AWG_MAX) })
  .refine(({ awgMin, awgMax }) => awgMin <= awgMax, {
    path: ['awgMax'],
    message: 'awgMax must not be below awgMin',
  });

/** /v1/catalog/wires: round enamelled magnet wire by AWG, thickest first. */
export function wireRoutes(): Hono {
  return new Hono().get('/', (c) => {
    const { awgMin, awgMax } = readParams(c.req.query(), WireQuerySchema);
    return sendJson(c, 200, {
      note: CATALOG_NOTES.wires,
      items: roundWireCatalog({ awgMin, awgMax }),
    });
  });
}
