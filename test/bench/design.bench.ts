import { designConverter, SpecSchema, type Design, type Spec } from '../../solvers/index.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { activeClampTelecomSpec } from '../helpers/active-clamp-specs.js';
import { fullBridgeSpec, halfBridgeSpec, pushPullSpec } from '../helpers/double-ended-specs.js';
import { forwardTelecomSpec, resetWindingSpec } from '../helpers/forward-specs.js';
import { summarizeTimings, type TimingSummary } from './timing-summary.js';

/**
 * The specs the design benchmark times, one per topology. Invented scenarios (see the helpers):
 * a 36–72 V telecom-style input to 12 V for the flyback and the forwards, the double-ended
 * helpers' scenarios for the push-pull and the bridges; not any product.
 */
export const BENCH_SPECS: Record<string, Spec> = {
  flyback: telecomSpec(),
  'two-switch-forward': forwardTelecomSpec(),
  'forward-reset-winding': resetWindingSpec(1),
  'active-clamp-forward': activeClampTelecomSpec(),
  'push-pull': pushPullSpec(),
  'half-bridge': halfBridgeSpec(),
  'full-bridge': fullBridgeSpec(),
};

/** Issue 3's target for one design of any topology over its 9 corners, s (the median decides). */
export const DESIGN_TARGET_S = 1e-3;

/** Issue 4's target for one design with its transformer (converter and magnetics), s. */
export const MAGNETICS_DESIGN_TARGET_S = 2e-3;

/** `spec` with its transformer assumed (the converter alone) or designed. */
export function withMagneticsMode(spec: Spec, mode: 'assume' | 'design'): Spec {
  return { ...spec, magnetics: { ...spec.magnetics, mode } };
}

/**
 * `spec` with every choice of the magnetics `design` carries fixed in its magnetics block: the
 * transformer's core shape, material, primary turns and each winding's wire (the gap follows
 * from Lm as in the search), and each output inductor's core shape,
 * material, turns and wire (`magnetics.outputInductors`, the design's fields of the same names;
 * the gap is cut for the same inductance again, which gives the same gap): what a core-search
 * job or a tolerance sample evaluates. Designing it repeats the converter's two solves and
 * evaluates that one transformer and those inductors instead of searching.
 */
export function evaluationSpec(spec: Spec, design: Design): Spec {
  const { transformer } = design;
  if (transformer === undefined) throw new Error('evaluationSpec: the design has no transformer');
  const primaryTurns = transformer.windings[0]?.turns;
  const outputInductors = (design.outputInductors ?? []).map((inductor) => ({
    outputIndex: inductor.outputIndex,
    coreShape: inductor.coreShape,
    materialId: inductor.materialId,
    turns: inductor.turns,
    wire: inductor.wire,
  }));
  return SpecSchema.parse({
    ...spec,
    magnetics: {
      ...spec.magnetics,
      coreShape: transformer.coreShape,
      ...(spec.magnetics.material === undefined ? { materialId: transformer.materialId } : {}),
      primaryTurns,
      wires: transformer.windings.map((winding) => winding.wire),
      ...(outputInductors.length === 0 ? {} : { outputInductors }),
    },
  });
}

/**
 * Times one complete design (choices plus every corner) of `spec` in this process: wall-clock
 * timings, and the process's CPU time for the same runs (`cpu`), which a shared machine inflates
 * less, since time spent preempted is not counted. Before timing, the spec is designed for at
 * least `warmUpS` seconds (and at least 300 times, or `iterations` if fewer): V8 takes hundreds
 * of designs to settle on the double-ended topologies' code (measured 2026-12-04, one process,
 * means per 200 designs: the push-pull 2.8, 1.9, 1.8, 0.7 ms, then about 0.45 ms from the
 * 800th on; the full bridge about 0.47 ms from the 1,400th), so a warm-up of 300 timed a
 * process still compiling. `warmUp` says what the warm-up took.
 */
export function benchDesign(
  name: string,
  spec: Spec,
  options: { iterations?: number; warmUpS?: number } = {},
): TimingSummary & { cpu: TimingSummary; warmUp: { count: number; meanS: number } } {
  const iterations = options.iterations ?? 3000;
  const warmUpS = options.warmUpS ?? 3;
  const first = designConverter(spec);
  if (!first.ok)
    throw new Error(`bench spec ${name} is infeasible: ${JSON.stringify(first.issues)}`);
  const cornerCount = first.value.corners.length;
  const warmUpStart = process.hrtime.bigint();
  let warmUpCount = 0;
  let warmUpElapsedS = 0;
  while (warmUpCount < Math.min(300, iterations) || warmUpElapsedS < warmUpS) {
    designConverter(spec);
    warmUpCount += 1;
    warmUpElapsedS = Number(process.hrtime.bigint() - warmUpStart) * 1e-9;
  }
  const samplesS: number[] = [];
  const cpuSamplesS: number[] = [];
  for (let i = 0; i < iterations; i += 1) {
    const cpuStart = process.cpuUsage();
    const start = process.hrtime.bigint();
    designConverter(spec);
    samplesS.push(Number(process.hrtime.bigint() - start) * 1e-9);
    const cpu = process.cpuUsage(cpuStart);
    cpuSamplesS.push((cpu.user + cpu.system) * 1e-6);
  }
  const label = `${name} design, ${cornerCount} corners`;
  return {
    ...summarizeTimings(samplesS),
    label,
    cpu: { ...summarizeTimings(cpuSamplesS), label },
    warmUp: { count: warmUpCount, meanS: warmUpElapsedS / warmUpCount },
  };
}
