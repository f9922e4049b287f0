import { z } from 'zod';
import { SpecSchema } from '../../solvers/index.js';
import { DesignAnswerSchema } from './design-answer-schema.js';
import { ResultMetaSchema } from './result-meta-schema.js';

/** One revision of a stored design as the API returns it. */
export const DesignViewSchema = z
  .strictObject({
    id: z.string().describe('The design id (a random UUID).'),
    revision: z.int().min(1).describe('Revision number, counting from 1; revisions never change.'),
    spec: SpecSchema.describe('The spec as evaluated: parsed, every default filled in.'),
    design: DesignAnswerSchema,
    meta: ResultMetaSchema,
    caution: z.string().describe('Read before use.'),
    links: z.strictObject({
      self: z.string().describe('This revision.'),
      latest: z.string().describe('The latest revision of this design.'),
      revisions: z.string().describe('The list of revisions.'),
      netlist: z.string().describe('The SPICE netlist of this revision.'),
    }),
  })
  .describe('One immutable revision of a design: the spec, the engine result and provenance.');

export type DesignView = z.infer<typeof DesignViewSchema>;
