import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import type { TransformerDuty } from '../../../solvers/transformer/transformer-duty.js';

/**
 * Invented duty, not any product: a flyback at 100 kHz, Lm = 200 µH, Np/Ns = 4, continuous
 * conduction with the primary ramping from `valleyA` to `peakA` over D = 0.45, the secondary
 * carrying n times the magnetizing current down the other 0.55; one corner per entry.
 */
export function flybackDuty(
  corners: ReadonlyArray<{ valleyA: number; peakA: number }> = [{ valleyA: 0.6, peakA: 1.4 }],
): TransformerDuty {
  const periodS = 10e-6;
  const d = 0.45;
  const n = 4;
  const primary = corners.map(({ valleyA, peakA }) =>
    piecewiseLinear(periodS, [
      [0, valleyA],
      [d * periodS, peakA],
      [d * periodS, 0],
      [periodS, 0],
    ]),
  );
  const secondary = corners.map(({ valleyA, peakA }) =>
    piecewiseLinear(periodS, [
      [0, 0],
      [d * periodS, 0],
      [d * periodS, n * peakA],
      [periodS, n * valleyA],
    ]),
  );
  const magnetizing = corners.map(({ valleyA, peakA }) =>
    piecewiseLinear(periodS, [
      [0, valleyA],
      [d * periodS, peakA],
      [periodS, valleyA],
    ]),
  );
  return {
    ambientTemperatureC: 40,
    cornerLabels: corners.map((_, i) => `corner-${i}`),
    windings: [
      { name: 'primary', turnsPerPrimaryTurn: 1, role: { kind: 'primary' }, currentsA: primary },
      {
        name: 'secondary-1',
        turnsPerPrimaryTurn: 1 / n,
        role: { kind: 'output', outputIndex: 0 },
        currentsA: secondary,
      },
    ],
    magnetizingInductanceH: 200e-6,
    magnetizingCurrentsA: magnetizing,
    gapRole: 'set-inductance',
  };
}

/**
 * Invented duty, not any product: a forward converter's transformer at 100 kHz, Lm = 150 µH
 * (ungapped), Ns/Np = 1/4, D = 0.4 from 48 V: the secondary carries `outputA` flat while the
 * switch is on, the primary that over four plus the magnetizing ramp 0 → 1.28 A, which resets
 * to zero over the next 0.4 of the period; one corner per entry.
 */
export function forwardDuty(outputsA: readonly number[] = [20]): TransformerDuty {
  const periodS = 10e-6;
  const onS = 0.4 * periodS;
  const magnetizingPeakA = (48 * onS) / 150e-6;
  const magnetizing = piecewiseLinear(periodS, [
    [0, 0],
    [onS, magnetizingPeakA],
    [2 * onS, 0],
    [periodS, 0],
  ]);
  const primary = outputsA.map((outputA) =>
    piecewiseLinear(periodS, [
      [0, outputA / 4],
      [onS, outputA / 4 + magnetizingPeakA],
      [onS, 0],
      [periodS, 0],
    ]),
  );
  const secondary = outputsA.map((outputA) =>
    piecewiseLinear(periodS, [
      [0, outputA],
      [onS, outputA],
      [onS, 0],
      [periodS, 0],
    ]),
  );
  return {
    ambientTemperatureC: 40,
    cornerLabels: outputsA.map((_, i) => `corner-${i}`),
    windings: [
      { name: 'primary', turnsPerPrimaryTurn: 1, role: { kind: 'primary' }, currentsA: primary },
      {
        name: 'secondary-1',
        turnsPerPrimaryTurn: 1 / 4,
        role: { kind: 'output', outputIndex: 0 },
        currentsA: secondary,
      },
    ],
    magnetizingInductanceH: 150e-6,
    magnetizingCurrentsA: outputsA.map(() => magnetizing),
    gapRole: 'ungapped',
  };
}
