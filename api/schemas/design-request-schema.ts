import { z } from 'zod';
import { SpecSchema } from '../../solvers/index.js';

/** Body of POST /v1/designs and POST /v1/designs/{id}/revisions. */
export const DesignRequestSchema = z
  .strictObject({ spec: SpecSchema })
  .describe('A spec to evaluate; omitted fields take the documented defaults.');

export type DesignRequest = z.infer<typeof DesignRequestSchema>;
