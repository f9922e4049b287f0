import type { Design } from '../../solvers/index.js';
import type { DesignAnswer } from '../schemas/design-answer-schema.js';

/**
 * `design` without its corners' `waveforms` (62 of the flyback example's 102 kB): what a revision
 * stores and what an answer carries unless `include=waveforms` asks for them. Every other member
 * keeps its place, so the JSON text is the full design's with the waveforms cut out.
 */
export function withoutWaveforms(design: Design | DesignAnswer): DesignAnswer {
  return { ...design, corners: design.corners.map(cornerWithoutWaveforms) } as DesignAnswer;
}

/**
 * A copy of `corner` without `waveforms`, its other members in their order. Copied member by
 * member: an object rest (`{ waveforms, ...rest }`) took four times as long on the engine's
 * corners (about 80 against 20 µs a flyback design).
 */
function cornerWithoutWaveforms(corner: object): object {
  const copy: Record<string, unknown> = {};
  for (const key of Object.keys(corner)) {
    if (key !== 'waveforms') copy[key] = (corner as Record<string, unknown>)[key];
  }
  return copy;
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
