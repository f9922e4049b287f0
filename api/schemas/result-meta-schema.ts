import { z } from 'zod';

/** The provenance every stored result carries (solvers' ResultMeta), for documents and tests. */
export const ResultMetaSchema = z
  .strictObject({
    solverVersion: z.string().describe('Version of the engine that computed the numbers.'),
    schemaVersion: z.string().describe('Version of the shape of specs and results.'),
    inputHash: z
      .string()
      .regex(/^[0-9a-f]{64}$/)
      .describe('SHA-256 (hex) of the canonical JSON of the parsed input, defaults applied.'),
    createdAt: z.iso.datetime().describe('When the result was computed (ISO 8601, UTC).'),
  })
  .describe('Provenance of a result: same input and solver version give the same numbers.');
