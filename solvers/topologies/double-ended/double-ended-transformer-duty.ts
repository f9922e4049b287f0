import type { DoubleEndedCorner, DoubleEndedDesign } from '../../design/design-schema.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { TransformerDuty, WindingDuty } from '../../transformer/transformer-duty.js';

/**
 * Returns what a double-ended converter's transformer carries at each corner: the primary (a
 * push-pull's two halves, each with its switch's current), each output's secondary (a center
 * tap's two halves), and the magnetizing current, which swings symmetrically about zero. The core
 * is left ungapped (common practice for a transformer that stores no energy by design); for a
 * push-pull, turns ratios and Lm refer to one primary half.
 */
export function doubleEndedTransformerDuty(
  spec: Spec,
  choices: DoubleEndedDesign['choices'],
  corners: readonly DoubleEndedCorner[],
): TransformerDuty {
  const first = corners[0];
  if (first === undefined) throw new RangeError('doubleEndedTransformerDuty: no corners');
  const secondaryCount = choices.secondaryArrangements.reduce(
    (sum, arrangement) => sum + (arrangement === 'center-tapped' ? 2 : 1),
    0,
  );
  const primaryCount = first.waveforms.windingCurrentsA.length - secondaryCount;
  const windings: WindingDuty[] = [];
  for (let p = 0; p < primaryCount; p++) {
    windings.push({
      name: first.windings[p]?.name ?? `primary-${p}`,
      turnsPerPrimaryTurn: 1,
      role: { kind: 'primary' },
      currentsA: windingCurrentsOf(corners, p),
      // A push-pull's halves carry its two switches' currents, one the other's half a period on
      // (`gridWaveformPair`: side 1 is side 0 with the halves swapped).
      ...(p === 1 ? { halfPeriodShiftOf: 0 } : {}),
    });
  }
  let index = primaryCount;
  spec.outputs.forEach((_, k) => {
    const halves = choices.secondaryArrangements[k] === 'center-tapped' ? 2 : 1;
    for (let h = 0; h < halves; h++, index++) {
      windings.push({
        name: first.windings[index]?.name ?? `secondary-${k + 1}`,
        turnsPerPrimaryTurn: 1 / (choices.outputTurnsRatios[k] ?? choices.turnsRatio),
        role: { kind: 'output', outputIndex: k },
        currentsA: windingCurrentsOf(corners, index),
        // A center tap's second half, likewise the first's half a period on.
        ...(h === 1 ? { halfPeriodShiftOf: index - 1 } : {}),
      });
    }
  });
  return {
    ambientTemperatureC: spec.ambientTemperatureC,
    cornerLabels: corners.map((corner) => corner.label),
    windings,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    magnetizingCurrentsA: corners.map((corner) => corner.waveforms.magnetizingCurrentA),
    gapRole: 'ungapped',
  };
}

/**
 * Winding `index`'s current at every corner. A module-level function, not a named closure:
 * under tsx esbuild's keepNames gives each named closure an Object.defineProperty call.
 */
function windingCurrentsOf(corners: readonly DoubleEndedCorner[], index: number) {
  return corners.map(
    (corner) => corner.waveforms.windingCurrentsA[index] ?? corner.waveforms.primaryCurrentA,
  );
}
