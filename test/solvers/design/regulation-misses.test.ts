import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { REGULATION_TOLERANCE } from '../../../solvers/design/design-summary.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { fullBridgeSpec, halfBridgeSpec, pushPullSpec } from '../../helpers/double-ended-specs.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';

/** The spec with its transformer designed and two light load points (invented scenarios). */
function lightLoad(spec: Spec, loadFractions: number[]): Spec {
  return { ...spec, loadFractions, magnetics: { ...spec.magnetics, mode: 'design' } };
}

/**
 * The push-pull of the helpers with its transformer assumed, loads of 18.48 % and 24.59 % and
 * 103.14 kHz (invented scenario): its nominal-input corner at 18.48 % missed 12 V (12.023 V)
 * where the span of the node ring's shared fall crossed the end of the ring's first swing
 * (DEVELOPERS.md, "Stray states and regulation misses"); the event model holds it (no miss now).
 * Found by a scan of random load pairs and frequencies on 2026-12-03.
 */
function pushPullMissSpec(): Spec {
  const spec = pushPullSpec({ switchingFrequencyHz: 103.14e3 });
  return {
    ...spec,
    loadFractions: [0.1848, 0.2459],
    magnetics: { ...spec.magnetics, mode: 'assume' },
  };
}

/**
 * The half bridge of the helpers with a second output (the first's voltage over 2.4 and a tenth
 * of its current, as the netlist test's two-output cases), its transformer assumed, no leakage,
 * loads of 33.44 % and 11.58 % and 277.5 kHz (invented scenario): its lowest-input corner at
 * 11.58 % load missed 24 V (25.31 V) while several outputs kept the damped light-load ring; the
 * several-output event model holds it (DEVELOPERS.md, "Light load with several outputs: the
 * event model"). Found by a scan of random load pairs and frequencies on 2026-12-03.
 */
function halfBridgeTwoOutputsMissSpec(): Spec {
  const base = { loadFractions: [0.3344, 0.1158], switchingFrequencyHz: 277.5e3 };
  const first = halfBridgeSpec(base).outputs[0];
  if (first === undefined) throw new Error('no first output');
  const spec = halfBridgeSpec({
    ...base,
    transformer: { leakageInductanceH: 0 },
    outputs: [first, { ...first, voltageV: first.voltageV / 2.4, currentA: first.currentA / 10 }],
  });
  return { ...spec, magnetics: { ...spec.magnetics, mode: 'assume' } };
}

// Light load points where the push-pull and bridge models' ring made Vo(D) step (found by a scan
// of load pairs on 2026-12-03: the half bridge's missed until the ring started at the drops'
// difference); the flyback and forward are controls.
const CASES: Array<[string, Spec]> = [
  ['push-pull, 18.48 % and 24.59 % load at 103.14 kHz', pushPullMissSpec()],
  [
    'half bridge, two outputs, 33.44 % and 11.58 % load at 277.5 kHz',
    halfBridgeTwoOutputsMissSpec(),
  ],
  ['half bridge, 5 % and 100 % load', lightLoad(halfBridgeSpec(), [0.05, 1])],
  ['half bridge, 17 % and 20 % load', lightLoad(halfBridgeSpec(), [0.17, 0.2])],
  ['full bridge, 1 % and 2 % load', lightLoad(fullBridgeSpec(), [0.01, 0.02])],
  ['push-pull, 1 % and 70 % load', lightLoad(pushPullSpec(), [0.01, 0.7])],
  ['flyback, 10 % and 100 % load', lightLoad(telecomSpec(), [0.1, 1])],
  ['two-switch forward, 5 % and 100 % load', lightLoad(forwardTelecomSpec(), [0.05, 1])],
];

describe('summary.regulationMisses', () => {
  it.each(CASES)(
    'lists exactly the corners whose regulated output misses its target (%s)',
    (_, spec) => {
      // ref: common practice, a converter's first output is the regulated one and a design that
      // reports it off target must say so (the 0.1 % band is this service's own rule)
      const result = designConverter(spec);
      if (!result.ok) throw new Error(JSON.stringify(result.issues));
      const targetV = spec.outputs[0]?.voltageV ?? NaN;
      const missed = result.value.corners
        .filter(
          (corner) =>
            Math.abs((corner.outputs[0]?.voltageV ?? NaN) - targetV) >
            REGULATION_TOLERANCE * targetV,
        )
        .map((corner) => ({
          corner: corner.label,
          outputVoltageV: corner.outputs[0]?.voltageV,
          targetVoltageV: targetV,
        }));
      expect(result.value.summary.regulationMisses).toEqual(missed);
    },
  );

  it('holds the two-output half-bridge corner the damped light-load ring missed at 24 V', () => {
    // ref: common practice, a converter's first output is the regulated one. This corner (lowest
    // input, 11.58 % load) missed 24 V by 5.5 % (25.31 V) before the several-output event model,
    // even after the cold re-solve. A scan of 600 random two-output specs (200 a topology,
    // loads 2–42 %, 70–300 kHz, no or the default leakage; seed 7, 2026-12-04) found 15 designs
    // with a miss before and none after, so this case no longer keeps the check above from
    // passing on empty lists: pick a miss from a wider scan for that once one is found.
    const result = designConverter(CASES[1]?.[1] as Spec);
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const corner = result.value.corners.find((c) => c.label === 'min-input/11.6pct-load');
    expect(corner).toBeDefined();
    expectClose(corner?.outputs[0]?.voltageV ?? NaN, 24, { rel: REGULATION_TOLERANCE });
    expect(result.value.summary.regulationMisses).toEqual([]);
  });
});
