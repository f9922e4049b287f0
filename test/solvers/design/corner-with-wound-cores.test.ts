import { describe, expect, it } from 'vitest';
import { cornerWithTransformer } from '../../../solvers/design/corner-with-transformer.js';
import { cornerWithWoundCores } from '../../../solvers/design/corner-with-wound-cores.js';
import { cornersWithMagnetics, fixMagnetics } from '../../../solvers/design/magnetics-pass.js';
import { solveEveryCorner } from '../../../solvers/design/transformer-pass.js';
import { inductorWindingDuty } from '../../../solvers/inductor/inductor-duty.js';
import { topologyById } from '../../../solvers/topologies/index.js';
import { expectClose } from '../../helpers/expect-close.js';
import { forwardTelecomSpec, resetWindingSpec } from '../../helpers/forward-specs.js';

/** The invented telecom forward solved again with its designed magnetics, and them evaluated. */
function forwardWithMagnetics(telecom = forwardTelecomSpec()) {
  const spec = { ...telecom, magnetics: { ...telecom.magnetics, mode: 'design' as const } };
  const topology = topologyById(spec.topology);
  const first = solveEveryCorner(topology, spec);
  if (!first.ok) throw new Error('first solve');
  const fixed = fixMagnetics(topology, spec, first.value);
  if (!fixed.ok || fixed.value === undefined) throw new Error('magnetics fixed');
  const second = solveEveryCorner(topology, fixed.value.spec);
  if (!second.ok) throw new Error('second solve');
  const evaluated = cornersWithMagnetics(
    topology,
    fixed.value,
    second.value.choices,
    second.value.corners,
  );
  const transformer = evaluated.transformer;
  const inductor = evaluated.inductors[0];
  if (transformer === undefined || inductor === undefined) throw new Error('magnetics evaluated');
  return { corners: second.value.corners, transformer, inductor };
}

describe('cornerWithWoundCores', () => {
  const { corners, transformer, inductor } = forwardWithMagnetics();
  const inductorDuty = inductorWindingDuty(inductor.duty);

  it('cornerWithWoundCores(corner, [transformer, inductor]) equals adding them one after the other', () => {
    corners.forEach((corner, index) => {
      const transformerLosses = transformer.evaluation.corners[index];
      const inductorLosses = inductor.evaluation.corners[index];
      if (transformerLosses === undefined || inductorLosses === undefined)
        throw new Error('corner');
      // Consistency check, no outside reference: one copy with both cores is the corner the
      // transformer's losses and then the inductor's give, number for number and line for line.
      const once = cornerWithWoundCores(corner, [
        { duty: transformer.duty, losses: transformerLosses, coreComponent: 'transformer-core' },
        { duty: inductorDuty, losses: inductorLosses, coreComponent: inductor.duty.name },
      ]);
      const inTurn = cornerWithTransformer(
        cornerWithTransformer(corner, transformer.duty, transformerLosses),
        inductorDuty,
        inductorLosses,
        inductor.duty.name,
      );
      expect(JSON.stringify(once)).toBe(JSON.stringify(inTurn));
    });
  });

  it('cornerWithWoundCores(corner, cores) draws from the input the output power plus every loss line', () => {
    corners.forEach((corner, index) => {
      const transformerLosses = transformer.evaluation.corners[index];
      const inductorLosses = inductor.evaluation.corners[index];
      if (transformerLosses === undefined || inductorLosses === undefined)
        throw new Error('corner');
      const finished = cornerWithWoundCores(corner, [
        { duty: transformer.duty, losses: transformerLosses, coreComponent: 'transformer-core' },
        { duty: inductorDuty, losses: inductorLosses, coreComponent: inductor.duty.name },
      ]);
      const lossesW = finished.losses.reduce((sum, line) => sum + line.powerW, 0);
      // ref: common practice — conservation of energy: Pin = Pout + Σ losses, η = Pout/Pin.
      expectClose(finished.inputPowerW, finished.outputPowerW + lossesW, { rel: 1e-12 });
      expectClose(finished.efficiency, finished.outputPowerW / finished.inputPowerW, {
        rel: 1e-12,
      });
      // ref: common practice — a winding's copper loss is its DC part plus its AC part (Dowell).
      const line = finished.losses.find(
        (item) => item.component === inductor.duty.name && item.mechanism === 'copper',
      );
      const winding = inductorLosses.windings[0];
      if (line === undefined || winding === undefined) throw new Error('inductor copper line');
      expectClose(line.powerW, winding.dcLossW + winding.acLossW, { rel: 1e-12 });
      const core = finished.losses.find(
        (item) => item.component === inductor.duty.name && item.mechanism === 'core',
      );
      expectClose(core?.powerW ?? NaN, inductorLosses.coreLossW, { rel: 1e-12 });
    });
  });

  it("cornerWithWoundCores(corner, cores) counts the reset winding's copper in the reset-winding forward's total", () => {
    const reset = forwardWithMagnetics(resetWindingSpec(1));
    reset.corners.forEach((corner, index) => {
      const losses = reset.transformer.evaluation.corners[index];
      if (losses === undefined) throw new Error('corner');
      const finished = cornerWithWoundCores(corner, [
        { duty: reset.transformer.duty, losses, coreComponent: 'transformer-core' },
      ]);
      // ref: common practice — conservation of energy: every loss the transformer's evaluation
      // finds (each winding's copper, the reset winding's included, and the core) is drawn from
      // the input, so the corner's lines of the transformer sum to the evaluation's total.
      const names = reset.transformer.duty.windings.map((winding) => winding.name);
      expect(names).toContain('reset-winding');
      const transformerLinesW = finished.losses
        .filter(
          (line) =>
            (line.mechanism === 'copper' && names.includes(line.component)) ||
            line.component === 'transformer-core',
        )
        .reduce((sum, line) => sum + line.powerW, 0);
      expectClose(transformerLinesW, losses.totalLossW, { rel: 1e-12 });
      expectClose(
        finished.lossTotalW - corner.lossTotalW,
        transformerLinesW - copperLinesOf(corner, names),
        {
          rel: 1e-12,
        },
      );
    });
  });
});

/** The corner's copper lines of the windings named, W (before the evaluation's losses go in). */
function copperLinesOf(
  corner: { losses: { component: string; mechanism: string; powerW: number }[] },
  names: string[],
): number {
  return corner.losses
    .filter((line) => line.mechanism === 'copper' && names.includes(line.component))
    .reduce((sum, line) => sum + line.powerW, 0);
}
