import type { Corner, FlybackDesign } from '../../design/design-schema.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { TransformerDuty } from '../../transformer/transformer-duty.js';

/**
 * Returns what the flyback's coupled inductor carries at each corner: the primary winding
 * current (switch current, then the leakage current into the clamp), each secondary's current,
 * and the magnetizing current; the gap sets the magnetizing inductance.
 */
export function flybackTransformerDuty(
  spec: Spec,
  choices: FlybackDesign['choices'],
  corners: readonly Corner[],
): TransformerDuty {
  return {
    ambientTemperatureC: spec.ambientTemperatureC,
    cornerLabels: corners.map((corner) => corner.label),
    windings: [
      {
        name: 'primary',
        turnsPerPrimaryTurn: 1,
        role: { kind: 'primary' },
        currentsA: corners.map((corner) => corner.waveforms.primaryWindingCurrentA),
      },
      ...spec.outputs.map((_, k) => ({
        name: `secondary-${k + 1}`,
        turnsPerPrimaryTurn: 1 / (choices.outputTurnsRatios[k] ?? choices.turnsRatio),
        role: { kind: 'output' as const, outputIndex: k },
        currentsA: corners.map(
          (corner) =>
            corner.waveforms.secondaryCurrentsA[k] ?? corner.waveforms.primaryWindingCurrentA,
        ),
      })),
    ],
    magnetizingInductanceH: choices.magnetizingInductanceH,
    magnetizingCurrentsA: corners.map((corner) => corner.waveforms.magnetizingCurrentA),
    gapRole: 'set-inductance',
  };
}
