import { describe, expect, it } from 'vitest';
import { designConverter, doubleEndedNetlist, SpecSchema } from '../../../solvers/index.js';
import { fullBridgeSpec, pushPullSpec } from '../../helpers/double-ended-specs.js';

// The test helpers' invented full bridge (100 kHz, 100 pF switches) with 2 µH of leakage.
const spec = SpecSchema.parse(fullBridgeSpec({ transformer: { leakageInductanceH: 2e-6 } }));
const result = designConverter(spec);
if (!result.ok || result.value.topology !== 'full-bridge')
  throw new Error('expected a full bridge');
const design = result.value;

/** The largest step of the deck's `.tran` line (its fourth field), s. */
function tranStepS(
  deckSpec: typeof spec,
  deckDesign: Parameters<typeof doubleEndedNetlist>[1],
  options: { leakageRingStepsMin?: number; cornerLabel?: string },
): number {
  const text = doubleEndedNetlist(deckSpec, deckDesign, options);
  const tran = text.split('\n').find((line) => line.startsWith('.tran '));
  if (tran === undefined) throw new Error('no .tran line');
  return Number(tran.split(/\s+/)[4]);
}

/** The full bridge's largest step, with `leakageRingStepsMin` where given. */
function largestStepS(leakageRingStepsMin?: number): number {
  return tranStepS(spec, design, leakageRingStepsMin === undefined ? {} : { leakageRingStepsMin });
}

describe('doubleEndedNetlist, leakageRingStepsMin', () => {
  const defaultStepS = 1 / (100e3 * 200);
  // ref: common practice, the LC ring's period 2π·√(L·C): 2 µH with 100 pF, about 88.9 ns
  const ringS = 2 * Math.PI * Math.sqrt(2e-6 * 100e-12);

  it('leaves the default step at 0 (the bridges’ default) and where the ring already has the steps', () => {
    expect(largestStepS()).toBeCloseTo(defaultStepS, 15);
    expect(largestStepS(0)).toBeCloseTo(defaultStepS, 15);
    expect(largestStepS(1)).toBeCloseTo(defaultStepS, 15);
  });

  it('gives the leakage ring the steps asked for, down to a 32nd of the default step', () => {
    expect(largestStepS(6) / (ringS / 6)).toBeCloseTo(1, 5);
    // 32 steps of this ring (2.78 ns) against 50 ns by default: 18 times finer, honoured (the
    // quarter it stopped at before gave this ring 7 steps, where ngspice's gear integration
    // lengthens it: DEVELOPERS.md, "The push-pull's short dead time", ngspice (Debian))
    expect(largestStepS(32) / (ringS / 32)).toBeCloseTo(1, 5);
    expect(largestStepS(1000)).toBeCloseTo(defaultStepS / 32, 15);
  });
});

describe('doubleEndedNetlist, the push-pull deck’s default step', () => {
  // The test helpers' invented 18–36 V push-pull (100 kHz, 100 pF switches) with its default
  // leakage (0.01·Lm, some 0.45 µH) and its clamp.
  const ppSpec = pushPullSpec({ magnetics: { mode: 'assume' } });
  const ppResult = designConverter(ppSpec);
  if (!ppResult.ok || ppResult.value.topology !== 'push-pull')
    throw new Error('expected a push-pull');
  const ppDesign = ppResult.value;
  const stepS = (options: { leakageRingStepsMin?: number }) => tranStepS(ppSpec, ppDesign, options);

  it('resolves the leakage ring, 32 steps a period of it down to a 32nd of the step, unless told 0', () => {
    // ref: common practice, the LC ring's period 2π·√(Llk·C): 42 ns here, so the 32nd of the
    // default step (1.56 ns) bounds it, some 27 steps a ring
    const ringS = 2 * Math.PI * Math.sqrt(ppDesign.choices.leakageInductanceH * 100e-12);
    expect(stepS({}) / Math.max(ringS / 32, 1 / (100e3 * 200 * 32))).toBeCloseTo(1, 5);
    expect(stepS({ leakageRingStepsMin: 0 })).toBeCloseTo(1 / (100e3 * 200), 15);
  });
});

describe('doubleEndedNetlist, a bridge’s default step where its light-load ring runs', () => {
  // The same invented full bridge (2 µH, 100 pF) at 5 % load: a shared fall (the magnetizing
  // current starts off its negative peak), where the engine carries the leakage's ring undamped.
  const lightSpec = SpecSchema.parse(
    fullBridgeSpec({ transformer: { leakageInductanceH: 2e-6 }, loadFractions: [0.05, 1] }),
  );
  const lightResult = designConverter(lightSpec);
  if (!lightResult.ok || lightResult.value.topology !== 'full-bridge')
    throw new Error('expected a full bridge');
  const lightDesign = lightResult.value;
  const stepAt = (cornerLabel: string, options: { leakageRingStepsMin?: number } = {}) =>
    tranStepS(lightSpec, lightDesign, { cornerLabel, ...options });
  // ref: common practice, the LC ring's period 2π·√(L·C): 2 µH with 100 pF, about 88.9 ns
  const ringS = 2 * Math.PI * Math.sqrt(2e-6 * 100e-12);

  it('resolves the ring, 32 steps a period of it, at the light corner and not at full load', () => {
    const light = lightDesign.corners.find((c) => c.label === 'min-input/5pct-load');
    if (light === undefined) throw new Error('no light corner');
    // The corner is a shared fall (else the default would not apply).
    expect(light.waveforms.magnetizingCurrentA.values[0]).toBeGreaterThan(
      -0.99 * light.magnetizingCurrentPeakA,
    );
    // ref: ngspice (Debian package), the audit's 36–72 V full bridge with 1 µH (DEVELOPERS.md,
    // "The ngspice check", audit5): at the default step (some 2.4 steps a ring) its settled
    // output read 3.97 % below the engine, at 32 steps a ring 0.07 %
    expect(stepAt('min-input/5pct-load') / (ringS / 32)).toBeCloseTo(1, 5);
    expect(stepAt('min-input/5pct-load', { leakageRingStepsMin: 0 })).toBeCloseTo(
      1 / (100e3 * 200),
      15,
    );
    expect(stepAt('min-input/100pct-load')).toBeCloseTo(1 / (100e3 * 200), 15);
  });
});
