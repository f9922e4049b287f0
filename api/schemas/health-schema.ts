import { z } from 'zod';

/** Body of GET /healthz and of GET /readyz when ready. */
export const HealthSchema = z
  .strictObject({
    status: z.enum(['ok', 'ready']).describe('ok: the process runs; ready: it can serve requests.'),
    checks: z
      .strictObject({
        designStore: z.enum(['up', 'down']).describe('The design store.'),
        jobBackend: z
          .enum(['up', 'down'])
          .describe('The job backend (queue or in-process runner).'),
      })
      .optional(),
  })
  .describe('Liveness or readiness.');
