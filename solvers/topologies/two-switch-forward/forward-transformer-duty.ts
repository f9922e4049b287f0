import type { ForwardCorner } from '../../design/design-schema.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { TransformerDuty, WindingDuty } from '../../transformer/transformer-duty.js';

/** What a forward-family design's choices give the transformer duty. */
interface ForwardDutyChoices {
  turnsRatio: number;
  outputTurnsRatios: readonly number[];
  magnetizingInductanceH: number;
  /** Nr/Np of a reset winding, when the topology has one. */
  resetTurnsRatio?: number;
}

/**
 * Returns what a forward's transformer carries at each corner: the primary winding current,
 * each secondary's (its forward rectifier's) current, the reset winding's current where there is
 * one, and the magnetizing current; the core is left ungapped (a forward transformer stores no
 * energy by design, common practice), so Lm is what the wound core gives.
 */
export function forwardTransformerDuty(
  spec: Spec,
  choices: ForwardDutyChoices,
  corners: readonly ForwardCorner[],
): TransformerDuty {
  const windings: WindingDuty[] = [
    {
      name: 'primary',
      turnsPerPrimaryTurn: 1,
      role: { kind: 'primary' },
      currentsA: corners.map((corner) => corner.waveforms.primaryWindingCurrentA),
    },
    ...spec.outputs.map((_, k): WindingDuty => ({
      name: `secondary-${k + 1}`,
      turnsPerPrimaryTurn: 1 / (choices.outputTurnsRatios[k] ?? choices.turnsRatio),
      role: { kind: 'output', outputIndex: k },
      currentsA: corners.map(
        (corner) =>
          corner.waveforms.secondaryCurrentsA[k] ?? corner.waveforms.primaryWindingCurrentA,
      ),
    })),
  ];
  if (choices.resetTurnsRatio !== undefined) {
    windings.push({
      name: 'reset-winding',
      turnsPerPrimaryTurn: choices.resetTurnsRatio,
      role: { kind: 'reset' },
      currentsA: corners.map(
        (corner) =>
          corner.waveforms.resetWindingCurrentA ?? corner.waveforms.primaryWindingCurrentA,
      ),
    });
  }
  return {
    ambientTemperatureC: spec.ambientTemperatureC,
    cornerLabels: corners.map((corner) => corner.label),
    windings,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    magnetizingCurrentsA: corners.map((corner) => corner.waveforms.magnetizingCurrentA),
    gapRole: 'ungapped',
  };
}
