import type { ExampleObject, ParameterObject } from 'openapi3-ts/oas31';
import { INCLUDE_VALUES } from '../http/read-include.js';

/**
 * The `include` query parameter of the operations that answer whole designs, with `examples`
 * (keyed like the operation's other examples).
 */
export function includeParameter(
  examples: Record<string, ExampleObject>,
  { stored }: { stored: boolean },
): ParameterObject {
  const recomputed = stored
    ? ' A stored revision keeps no waveforms: they are recomputed from its stored spec when the running solver version is the one that made it and it reproduces the stored design byte for byte; otherwise 409 (waveforms-not-reproducible), which names both solver versions: POST the spec again as a new revision with include=waveforms to get them.'
    : '';
  return {
    name: 'include',
    in: 'query',
    required: false,
    description: `Optional parts of the answer (a comma-separated list; \`waveforms\` is the only one today): \`waveforms\` adds each corner's \`waveforms\` (left out by default: they are most of a design's size, about 60 % of the flyback example's).${recomputed} An unknown value is 400 with the path \`include\`.`,
    schema: { type: 'string', enum: [...INCLUDE_VALUES] },
    examples,
  };
}
