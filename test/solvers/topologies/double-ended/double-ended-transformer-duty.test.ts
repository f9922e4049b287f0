import { describe, expect, it } from 'vitest';
import { currentSpectrum } from '../../../../solvers/magnetics/winding-ac-resistance.js';
import { pushPull } from '../../../../solvers/topologies/push-pull.js';
import { halfBridge } from '../../../../solvers/topologies/half-bridge.js';
import { operatingCorners } from '../../../../solvers/design/operating-corners.js';
import type { Spec } from '../../../../solvers/spec/spec-schema.js';
import { valueAt } from '../../../../solvers/waveform/value-at.js';
import { expectClose } from '../../../helpers/expect-close.js';
import { halfBridgeSpec, pushPullSpec } from '../../../helpers/double-ended-specs.js';

/** The transformer duty of `spec` (invented scenarios of the helpers) over its corners. */
function dutyOf(topology: typeof pushPull | typeof halfBridge, spec: Spec) {
  const choices = topology.choose(spec);
  if (!choices.ok) throw new Error(JSON.stringify(choices.issues));
  const corners = operatingCorners(spec).map((corner) => {
    const solved = topology.solveCorner(spec, choices.value, corner);
    if (!solved.ok) throw new Error(JSON.stringify(solved.issues));
    return solved.value;
  });
  const duty = topology.transformerDuty?.(spec, choices.value, corners);
  if (duty === undefined) throw new Error('no duty');
  return duty;
}

describe('doubleEndedTransformerDuty', () => {
  it.each([
    ['push-pull', pushPull, pushPullSpec(), 2],
    ['half bridge', halfBridge, halfBridgeSpec(), 1],
  ] as const)(
    "doubleEndedTransformerDuty (%s) marks each half whose current is its partner's half a period on",
    (_, topology, spec, markedCount) => {
      const duty = dutyOf(topology, spec);
      const marked = duty.windings.flatMap((winding, k) =>
        winding.halfPeriodShiftOf === undefined ? [] : [[k, winding.halfPeriodShiftOf]],
      );
      expect(marked.length).toBe(markedCount);
      for (const [k, j] of marked) {
        expect(j).toBeLessThan(k as number);
        duty.cornerLabels.forEach((_label, index) => {
          const current = duty.windings[k as number]?.currentsA[index];
          const partner = duty.windings[j as number]?.currentsA[index];
          if (current === undefined || partner === undefined) throw new Error('no current');
          const periodS = current.periodS;
          // ref: common practice, the definition of a shift: i_k(t) = i_j(t − T/2) at every
          // breakpoint (just after it, so a jump compares its later side)
          const scaleA = Math.max(...partner.values.map(Math.abs));
          for (const t of current.timesS) {
            const at = Math.min(t + 1e-9 * periodS, periodS);
            const shifted = (at + periodS / 2) % periodS;
            expectClose(valueAt(current, at), valueAt(partner, shifted), { abs: 1e-9 * scaleA });
          }
          // ref: Fourier shift theorem, a delay of T/2 multiplies harmonic n by e^(−jπn) = (−1)ⁿ,
          // so every harmonic's magnitude, the mean and the AC mean square are the partner's
          const a = currentSpectrum(current, 64);
          const b = currentSpectrum(partner, 64);
          const largestA2 = Math.max(...b.harmonicSquaresA2);
          a.harmonicSquaresA2.forEach((squareA2, n) =>
            expectClose(squareA2, b.harmonicSquaresA2[n] as number, { abs: 1e-10 * largestA2 }),
          );
          expectClose(a.dcA, b.dcA, { abs: 1e-12 * scaleA });
          expectClose(a.acSquareA2, b.acSquareA2, { rel: 1e-10 });
        });
      }
    },
  );
});
