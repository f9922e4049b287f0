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
