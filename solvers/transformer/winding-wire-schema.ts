import { z } from 'zod';
import { AWG_MAX, AWG_MIN } from '../magnetics/round-wire-gauge.js';
import type { WindingWire } from './winding-wire.js';

/** One winding's conductor in a request: solid round wire (one or several in parallel) or litz. */
export const WindingWireSchema = z
  .discriminatedUnion('kind', [
    z.strictObject({
      kind: z.literal('round').describe('Solid round magnet wire (ASTM B258 sizes, grade 2).'),
      awg: z
        .int()
        .min(AWG_MIN)
        .max(AWG_MAX)
        .describe('Wire size, AWG (larger numbers are thinner).'),
      parallelCount: z
        .int()
        .min(1)
        .max(32)
        .describe('Wires wound side by side as one turn (dimensionless).'),
    }),
    z.strictObject({
      kind: z.literal('litz').describe('A litz bundle of enamelled strands (grade 1).'),
      strandAwg: z.int().min(AWG_MIN).max(AWG_MAX).describe('Strand size, AWG.'),
      strandCount: z.int().min(1).max(10000).describe('Strands in the bundle (dimensionless).'),
    }),
  ])
  .describe('The conductor of one winding.') satisfies z.ZodType<WindingWire>;
