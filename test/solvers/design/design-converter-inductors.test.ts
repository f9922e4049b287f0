import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { DesignSchema, type Design } from '../../../solvers/design/design-schema.js';
import { fixMagnetics } from '../../../solvers/design/magnetics-pass.js';
import { solveEveryCorner } from '../../../solvers/design/transformer-pass.js';
import { topologyById } from '../../../solvers/topologies/index.js';
import { saturationFluxDensity } from '../../../solvers/magnetics/saturation-flux-density.js';
import { MATERIAL_CLASSES } from '../../../solvers/magnetics/material-classes.js';
import { copperResistance } from '../../../solvers/materials/copper-resistance.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { peak } from '../../../solvers/waveform/peak.js';
import { repetitionFrequencyHz } from '../../../solvers/waveform/repetition-frequency.js';
import { roundWireGauge } from '../../../solvers/magnetics/round-wire-gauge.js';
import { skinDepth } from '../../../solvers/magnetics/skin-depth.js';
import { expectClose } from '../../helpers/expect-close.js';
import { pushPullSpec } from '../../helpers/double-ended-specs.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';

function designed(spec: Spec): Design {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  return result.value;
}

/** The forward's corners, typed as the buck-derived corners they are. */
function forwardCorners(design: Design) {
  if (design.topology !== 'two-switch-forward') throw new Error('expected a two-switch forward');
  return design.corners;
}

describe('designConverter designs the output inductors', () => {
  // Invented scenario (test/helpers/forward-specs.ts): 36–72 V to 12 V 8 A, 100 kHz.
  const spec = forwardTelecomSpec({ magnetics: { mode: 'design' } });
  const design = designed(spec);
  const corners = forwardCorners(design);
  const inductor = design.outputInductors?.[0];
  if (inductor === undefined || design.topology !== 'two-switch-forward') {
    throw new Error('a designed forward carries its output inductor');
  }
  const material = MATERIAL_CLASSES.find((m) => m.id === inductor.materialId);
  if (material === undefined) throw new Error('a catalog material');

  it('designConverter(forward) carries one designed inductor per output, for the chosen L', () => {
    // ref: spec contract — DesignSchema is the shape every client reads.
    expect(DesignSchema.safeParse(design).success).toBe(true);
    expect(design.outputInductors).toHaveLength(spec.outputs.length);
    expect(inductor.name).toBe('output-inductor-1');
    expectClose(inductor.inductanceH, design.choices.outputInductancesH[0] ?? NaN, { rel: 1e-6 });
    // The inductance is still the topology's own choice (ripple target), not a spec value.
    expect(design.choices.origins.outputInductancesH).toEqual(['target']);
    expect(Number.isInteger(inductor.turns)).toBe(true);
  });

  // ref: common practice — a filter inductor must not saturate at the worst (hottest, highest
  // current) corner: B = L·Ipk/(N·Amin) under fluxDensityUtilizationMax·Bsat(T), and its
  // winding must fit the window.
  it('designConverter(forward) keeps the inductor out of saturation and inside its window', () => {
    inductor.corners.forEach((corner, index) => {
      const bsat = saturationFluxDensity(material, corner.temperatureC);
      expectClose(corner.saturationFluxDensityT, bsat, { rel: 1e-12 });
      expect(corner.peakFluxDensityT).toBeLessThanOrEqual(
        spec.magnetics.fluxDensityUtilizationMax * bsat,
      );
      const currentA = corners[index]?.waveforms.outputInductorCurrentsA[0];
      if (currentA === undefined) throw new Error(`no inductor current at corner ${index}`);
      expectClose(corner.currentPeakA, peak(currentA), { rel: 1e-12 });
      expectClose(
        inductor.turns * corner.peakFluxDensityT * inductor.core.minimumAreaM2,
        inductor.inductanceH * corner.currentPeakA,
        { rel: 1e-6 },
      );
    });
    expect(inductor.windowFill).toBeLessThanOrEqual(spec.magnetics.windowFillMax);
    expect(inductor.windowHeightFill).toBeLessThanOrEqual(1);
    expect(inductor.summary.temperatureRiseMaxK).toBeLessThanOrEqual(
      spec.magnetics.temperatureRiseMaxK,
    );
    expect(inductor.summary.saturationMargin).toBeGreaterThanOrEqual(
      1 - spec.magnetics.fluxDensityUtilizationMax,
    );
    expect(inductor.summary.currentPeakMaxA).toBe(
      Math.max(...inductor.corners.map((corner) => corner.currentPeakA)),
    );
  });

  // ref: the converter's own mode: the topology says which corners run discontinuous, and the
  // inductor's current idles at zero there (common practice: DCM below ΔIL = 2·Io).
  it('designConverter(forward) handles the discontinuous corners', () => {
    const modes = corners.map((corner) => corner.outputInductorModes[0]);
    expect(modes).toContain('dcm');
    expect(inductor.corners.map((corner) => corner.conductionMode)).toEqual(modes);
  });

  // ref: IEC 60028 — R(T) = R20·(1 + 0.00393·(T − 20)): the second solve takes the inductor's
  // DC resistance at its hottest corner, as found on the first solution (hence 1e-3).
  it('designConverter(forward) solves with the inductor resistance at its hottest corner', () => {
    const hottestC = Math.max(...inductor.corners.map((corner) => corner.temperatureC));
    expectClose(
      design.choices.outputInductorResistancesOhm[0] ?? NaN,
      copperResistance(inductor.resistanceAt20COhm, hottestC),
      // The resistance is fixed from the first pass's evaluation; the corners shown are the
      // re-evaluation on the final solve, whose hottest corner sits a fraction of a kelvin
      // away (3e-3 of the resistance is about 0.8 K of copper, IEC 60028's 0.00393/K).
      { rel: 3e-3 },
    );
  });

  // ref: common practice — conservation of energy: the input supplies the inductor's core and
  // copper loss, which the budget lists (its copper line DC plus AC, and a core line), so the
  // efficiency falls by exactly that loss against the same budget without them.
  it('designConverter(forward) puts the inductor losses into every corner budget', () => {
    corners.forEach((corner, index) => {
      const losses = inductor.corners[index];
      if (losses === undefined) throw new Error(`no inductor corner ${index}`);
      const lines = corner.losses.filter((loss) => loss.component === 'output-inductor-1');
      const core = lines.find((loss) => loss.mechanism === 'core');
      const copper = lines.find((loss) => loss.mechanism === 'copper');
      expect(lines).toHaveLength(2);
      expectClose(core?.powerW ?? NaN, losses.coreLossW, { rel: 1e-12 });
      expectClose(copper?.powerW ?? NaN, losses.copperDcLossW + losses.copperAcLossW, {
        rel: 1e-12,
      });
      expectClose(
        losses.totalLossW,
        losses.coreLossW + losses.copperDcLossW + losses.copperAcLossW,
        {
          rel: 1e-12,
        },
      );
      const sum = corner.losses.reduce((total, loss) => total + loss.powerW, 0);
      expectClose(corner.inputPowerW, corner.outputPowerW + sum, { rel: 1e-12 });
      const withoutInductorW = corner.inputPowerW - losses.totalLossW;
      expectClose(
        corner.outputPowerW / withoutInductorW - corner.efficiency,
        (corner.outputPowerW * losses.totalLossW) / (withoutInductorW * corner.inputPowerW),
        { rel: 1e-9 },
      );
    });
  });

  // ref: common practice — conservation of energy. The same converter with the same fixed
  // magnetics but 'assume' (I²R at the fixed resistances, no core loss) solves the same operating
  // point; the designed corners draw more from the input by exactly the extra loss lines, and
  // the inductor's share of it is its core loss plus its copper loss less the assumed I²R.
  it("designConverter(forward) draws the inductor's loss more than 'assume' with the same parts", () => {
    const topology = topologyById(spec.topology);
    const first = solveEveryCorner(topology, spec);
    if (!first.ok) throw new Error('first solve');
    const fixed = fixMagnetics(topology, spec, first.value);
    if (!fixed.ok || fixed.value === undefined) throw new Error('magnetics fixed');
    const assumed = designed({
      ...fixed.value.spec,
      magnetics: { ...fixed.value.spec.magnetics, mode: 'assume' },
    });
    const assumedCorners = forwardCorners(assumed);
    corners.forEach((corner, index) => {
      const plain = assumedCorners[index];
      const losses = inductor.corners[index];
      if (plain === undefined || losses === undefined) throw new Error(`corner ${index}`);
      expect(corner.dutyCycle).toBe(plain.dutyCycle);
      const lineOf = (c: typeof corner, component: string, mechanism: string) =>
        c.losses.find((l) => l.component === component && l.mechanism === mechanism)?.powerW ?? 0;
      const assumedI2RW = lineOf(plain, 'output-inductor-1', 'copper');
      const inductorExtraW = losses.totalLossW - assumedI2RW;
      expectClose(
        lineOf(corner, 'output-inductor-1', 'copper') + lineOf(corner, 'output-inductor-1', 'core'),
        assumedI2RW + inductorExtraW,
        { rel: 1e-12 },
      );
      // The rest of the difference is the transformer's (its core line and its windings).
      let transformerExtraW = lineOf(corner, 'transformer-core', 'core');
      for (const loss of corner.losses) {
        if (loss.mechanism === 'copper' && loss.component !== 'output-inductor-1') {
          transformerExtraW += loss.powerW - lineOf(plain, loss.component, 'copper');
        }
      }
      expectClose(corner.inputPowerW - plain.inputPowerW, inductorExtraW + transformerExtraW, {
        rel: 1e-9,
        abs: 1e-12,
      });
      expect(corner.efficiency).toBeLessThan(plain.efficiency);
      // The inductor's core and AC copper loss are new; its DC loss at the corner's temperature
      // is at most the I²R the second solve assumed at the hottest corner.
      expect(losses.copperDcLossW).toBeLessThanOrEqual(assumedI2RW * (1 + 1e-3));
    });
  });

  // ref: common practice — with magnetics 'assume' the inductor is the spec's resistance alone:
  // no core line, and nothing designed.
  it("designConverter(forward, magnetics 'assume') designs no inductor", () => {
    const assumed = designed(forwardTelecomSpec());
    expect(assumed.outputInductors).toBeUndefined();
    const first = forwardCorners(assumed)[0];
    expect(first?.losses.some((loss) => loss.mechanism === 'core')).toBe(false);
  });

  // ref: common practice — the flyback's transformer is its only magnetic part.
  it('designConverter(flyback) carries no output inductor', () => {
    const flyback = designed(telecomSpec());
    expect(flyback.transformer).toBeDefined();
    expect(flyback.outputInductors).toBeUndefined();
  });

  // ref: common practice — a push-pull's output inductor sees twice the switching frequency.
  it('designConverter(push-pull) designs its inductor for ripple at twice fs', () => {
    const pushPull = designed(pushPullSpec({ magnetics: { mode: 'design' } }));
    if (pushPull.topology !== 'push-pull') throw new Error('expected a push-pull');
    const pp = pushPull.outputInductors?.[0];
    if (pp === undefined) throw new Error('a designed push-pull carries its output inductor');
    const currentA = pushPull.corners[0]?.waveforms.outputInductorCurrentsA[0];
    if (currentA === undefined) throw new Error('no inductor current');
    expectClose(repetitionFrequencyHz(currentA), 2 * 100e3, { rel: 1e-12 });
    // The strands are no thicker than two skin depths at 2·fs (at 100 °C, the wire rule).
    // The engine winds no foil next to an inductor's gap.
    if (pp.wire.kind === 'foil') throw new Error('expected round wire or litz');
    const strandAwg = pp.wire.kind === 'litz' ? pp.wire.strandAwg : pp.wire.awg;
    expect(roundWireGauge(strandAwg).bareDiameterM).toBeLessThanOrEqual(
      2 * skinDepth(2 * 100e3, { temperatureC: 100 }),
    );
    expect(pp.windowFill).toBeLessThanOrEqual(0.5);
    expect(pp.summary.fluxDensityUtilizationMax).toBeLessThanOrEqual(0.8);
  });
});
