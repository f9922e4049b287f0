import { z } from 'zod';
import { DesignSchema, type Design } from '../../solvers/index.js';

/**
 * A corner's `waveforms` in an answer: present only when the request asked for them
 * (`include=waveforms`); they are most of a design's bytes.
 */
const WAVEFORMS_DESCRIPTION =
  "The corner's waveforms over one switching period: only with include=waveforms (left out by default; they are most of a design's size).";

type OptionalWaveforms<D> = D extends { corners: (infer C)[] }
  ? Omit<D, 'corners'> & {
      corners: (C extends { waveforms: infer W } ? Omit<C, 'waveforms'> & { waveforms?: W } : C)[];
    }
  : never;

/** A design as the API answers it: the engine's Design, each corner's `waveforms` optional. */
export type DesignAnswer = OptionalWaveforms<Design>;

/** One topology's design schema as the engine declares it (an option of DesignSchema). */
type TopologyDesignSchema = (typeof DesignSchema.options)[number];

/** `schema` with each corner's `waveforms` optional. */
function withOptionalWaveforms(schema: TopologyDesignSchema): z.ZodObject {
  const corner = schema.shape.corners.element as z.ZodObject<{ waveforms: z.ZodType }>;
  const corners = z.array(
    corner.extend({ waveforms: corner.shape.waveforms.optional().describe(WAVEFORMS_DESCRIPTION) }),
  );
  const { description } = schema.shape.corners;
  return schema.extend({
    corners: description === undefined ? corners : corners.describe(description),
  });
}

/**
 * The engine's DesignSchema as the API answers it: the same union over topologies, with every
 * corner's `waveforms` left out unless asked for (`include=waveforms`).
 */
export const DesignAnswerSchema = z
  .discriminatedUnion(
    'topology',
    DesignSchema.options.map(withOptionalWaveforms) as unknown as [
      z.ZodObject<{ topology: z.ZodLiteral<Design['topology']> }>,
      ...z.ZodObject<{ topology: z.ZodLiteral<Design['topology']> }>[],
    ],
  )
  .describe(
    "A designed converter; its shape depends on the topology. Each corner's waveforms only with include=waveforms.",
  ) as unknown as z.ZodType<DesignAnswer>;
