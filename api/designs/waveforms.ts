import type { Design } from '../../solvers/index.js';
import type { DesignAnswer } from '../schemas/design-answer-schema.js';

/**
 * `design` without its corners' `waveforms` (62 of the flyback example's 102 kB): what a revision
 * stores and what an answer carries unless `include=waveforms` asks for them. Every other member
 * keeps its place, so the JSON text is the full design's with the waveforms cut out.
 */
export function withoutWaveforms(design: Design | DesignAnswer): DesignAnswer {
  return {
    ...design,
    corners: design.corners.map((corner) => {
      const { waveforms: _left, ...rest } = corner;
      return rest;
    }),
  } as DesignAnswer;
}

/** The bytes of a corner's waveforms member in a content's JSON text. */
const WAVEFORMS_MEMBER = Buffer.from('"waveforms":');

/**
 * Whether stored JSON text holds waveforms: revisions stored before they became opt-in do. A
 * string value cannot hold these bytes (its quotes are escaped), and no other member is called
 * so; a false positive would only cost a parse.
 */
export function jsonHasWaveforms(json: Buffer): boolean {
  return json.includes(WAVEFORMS_MEMBER);
}
