import type { ForwardCorner } from '../../design/design-schema.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { Waveform } from '../../waveform/waveform.js';
import { deviceStress, windingStress } from '../device-stress.js';
import type { OutputStage } from './output-stage.js';
import type { OutputStageWaveforms } from './output-stage-waveforms.js';

/**
 * Returns the rectifier and winding stresses of a single-ended forward: each output's forward
 * and freewheeling rectifier, then the primary, each secondary (its forward rectifier's current)
 * and each output inductor, read off their waveforms.
 */
export function forwardStageStresses(
  spec: Spec,
  stages: readonly OutputStage[],
  waves: readonly OutputStageWaveforms[],
  primaryWindingA: Waveform,
  primaryResistanceOhm: number,
): Pick<ForwardCorner, 'rectifiers' | 'windings'> {
  return {
    rectifiers: rectifierStresses(spec, waves),
    windings: [
      windingStress('primary', primaryWindingA, primaryResistanceOhm),
      ...waves.map((w, k) =>
        windingStress(`secondary-${k + 1}`, w.forwardA, stages[k]?.windingResistanceOhm ?? 0),
      ),
      ...waves.map((w, k) =>
        windingStress(
          `output-inductor-${k + 1}`,
          w.inductorA,
          stages[k]?.inductorResistanceOhm ?? 0,
        ),
      ),
    ],
  };
}

/**
 * Each output's forward and freewheeling rectifier, in output order: a plain loop, not
 * `flatMap`, which took about 2 µs a call under Node 20 (see double-ended-corner.ts, `joined`).
 */
function rectifierStresses(
  spec: Spec,
  waves: readonly OutputStageWaveforms[],
): ForwardCorner['rectifiers'] {
  const stresses: ForwardCorner['rectifiers'] = [];
  for (let k = 0; k < waves.length; k++) {
    const w = waves[k] as OutputStageWaveforms;
    const ratingV = spec.outputs[k]?.rectifier.voltageRatingV;
    stresses.push(
      deviceStress(`forward-rectifier-${k + 1}`, w.forwardA, w.forwardReverseV, ratingV),
      deviceStress(`freewheel-rectifier-${k + 1}`, w.freewheelA, w.freewheelReverseV, ratingV),
    );
  }
  return stresses;
}

/**
 * Each stage's forward and freewheeling rectifier voltage, in output order: a plain loop, not
 * `flatMap`, which took about 2 µs a call under Node 20 (see double-ended-corner.ts, `joined`).
 */
export function rectifierVoltages(
  stages: ReadonlyArray<Pick<OutputStageWaveforms, 'forwardReverseV' | 'freewheelReverseV'>>,
): Waveform[] {
  const voltages: Waveform[] = [];
  for (const w of stages) voltages.push(w.forwardReverseV, w.freewheelReverseV);
  return voltages;
}
