import { z } from 'zod';
import { AWG_MAX, AWG_MIN } from '../magnetics/round-wire-gauge.js';
import { FOIL_INSULATION_THICKNESS_M } from './foil-winding-choice.js';
import type { WindingWire } from './winding-wire.js';

/**
 * One winding's conductor in a request: solid round wire (one or several in parallel), litz, or
 * copper foil (one turn per layer).
 */
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
    z.strictObject({
      kind: z
        .literal('foil')
        .describe(
          'Annealed copper foil (IEC 60028), one turn to a layer, insulating film between turns.',
        ),
      thicknessM: z
        .number()
        .positive()
        .max(2e-3)
        .describe('Copper thickness across the window, m (above 0, at most 2 mm).'),
      widthM: z
        .number()
        .positive()
        .max(0.2)
        .optional()
        .describe(
          "Copper width along the leg, m; the window's breadth less the end margins when omitted. A foil wider than that breadth on the chosen core is a 422 window_fill_limit issue.",
        ),
      insulationThicknessM: z
        .number()
        .min(0)
        .max(1e-3)
        .default(FOIL_INSULATION_THICKNESS_M)
        .describe(
          'Insulating film between successive turns, m; 50 µm when omitted (common practice: a polyester film of a few tens of µm; functional insulation only).',
        ),
    }),
  ])
  .describe('The conductor of one winding.') satisfies z.ZodType<WindingWire>;
