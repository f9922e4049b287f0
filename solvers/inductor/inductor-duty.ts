import type { TransformerDuty } from '../transformer/transformer-duty.js';
import type { Waveform } from '../waveform/waveform.js';

/**
 * What a solved buck-derived converter asks of one output inductor, read off its corners: the
 * inductance the topology chose and the inductor current at every corner (DC plus the triangular
 * ripple, falling to zero and idling where the corner is discontinuous). Plain data, SI units.
 */
export interface InductorDuty {
  /** Which output the inductor filters (0-based). */
  outputIndex: number;
  /** The corner's copper-loss line of this inductor, for example 'output-inductor-1'. */
  name: string;
  ambientTemperatureC: number;
  /** Labels of the corners, in the order every per-corner array follows. */
  cornerLabels: readonly string[];
  /** Inductance the corners were solved with, H: the gap is cut for it. */
  inductanceH: number;
  /** The inductor current at each corner, A. */
  currentsA: readonly Waveform[];
}

/** What the output inductors' duties are read from: a design's choices and corners. */
export interface InductorSource {
  choices: object;
  corners: readonly { label: string; waveforms: object }[];
}

/**
 * Returns the duty of each output inductor of a solved design: one per output of a buck-derived
 * topology (whose choices hold outputInductancesH and whose corners carry
 * waveforms.outputInductorCurrentsA), none for a topology without output inductors (the flyback).
 */
export function outputInductorDuties(
  ambientTemperatureC: number,
  solved: InductorSource,
): InductorDuty[] {
  const inductances = (solved.choices as { outputInductancesH?: readonly number[] })
    .outputInductancesH;
  if (inductances === undefined) return [];
  return inductances.map((inductanceH, outputIndex) => ({
    outputIndex,
    name: `output-inductor-${outputIndex + 1}`,
    ambientTemperatureC,
    cornerLabels: solved.corners.map((corner) => corner.label),
    inductanceH,
    currentsA: solved.corners.map((corner) => {
      // Read in place, not through a named closure (under tsx esbuild's keepNames gives each
      // one an Object.defineProperty call).
      const current = (corner.waveforms as { outputInductorCurrentsA?: readonly Waveform[] })
        .outputInductorCurrentsA?.[outputIndex];
      if (current === undefined) {
        throw new RangeError(`outputInductorDuties: ${corner.label} lacks inductor ${outputIndex}`);
      }
      return current;
    }),
  }));
}

/**
 * Returns the inductor as the wound-core evaluation sees it: one winding (the reference winding,
 * role primary) carrying the inductor current, which is also the current whose flux linkage
 * L·i the core holds, B = L·i/(N·A); the gap is cut for the inductance, or with `isGapFixed`
 * taken from the build (gap role 'ungapped': the core's own gap gives the inductance, which the
 * duty's then equals).
 */
export function inductorWindingDuty(duty: InductorDuty, isGapFixed = false): TransformerDuty {
  return {
    ambientTemperatureC: duty.ambientTemperatureC,
    cornerLabels: duty.cornerLabels,
    windings: [
      {
        name: duty.name,
        turnsPerPrimaryTurn: 1,
        role: { kind: 'primary' },
        currentsA: duty.currentsA,
      },
    ],
    magnetizingInductanceH: duty.inductanceH,
    magnetizingCurrentsA: duty.currentsA,
    gapRole: isGapFixed ? 'ungapped' : 'set-inductance',
  };
}
