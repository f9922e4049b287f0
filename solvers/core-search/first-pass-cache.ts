import type { CoreGeometry } from '../magnetics/core-geometry.js';
import type { GappedCore } from '../magnetics/gapped-core.js';
import { gappedInductance } from '../magnetics/gapped-inductance.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { copperResistance } from '../materials/copper-resistance.js';
import { turnsFromPrimary } from '../transformer/transformer-turns.js';
import { wireDimensions } from '../transformer/winding-wire.js';
import {
  firstPass,
  outputTurnsRatiosOf,
  type FirstPass,
  type SolvedPass,
  type WindingResistances,
} from './first-pass.js';
import type { FrequencySpace } from './search-space.js';
import { operatingCorners } from '../design/operating-corners.js';
import { outputInductorsOfMaterial } from './evaluate-candidate.js';
import { outputInductorDuties } from '../inductor/inductor-duty.js';
import { evaluateInductor } from '../inductor/design-inductor.js';
import type { FixedInductor } from '../design/inductor-pass.js';

/**
 * The first passes solved for one frequency's space, by magnetizing inductance (and whole-turns
 * ratios): shared by every block and chunk of the space in this process. A first pass is a pure
 * function of the space and its key, so sharing it changes no chunk's output.
 */
const PASSES = new WeakMap<FrequencySpace, Map<string, FirstPass>>();
export function passesOf(f: FrequencySpace): Map<string, FirstPass> {
  let passes = PASSES.get(f);
  if (passes === undefined) {
    passes = new Map();
    PASSES.set(f, passes);
  }
  return passes;
}

/** The first pass for gap step `g` (solved once per distinct magnetizing inductance). */
export function passFor(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  g: number,
  geometry: CoreGeometry,
  material: MaterialClass,
  primaryTurns: number,
): FirstPass {
  const step = f.gaps[g]!;
  let inductanceH: number | undefined;
  if (step.kind === 'inductance') inductanceH = step.magnetizingInductanceH;
  if (step.kind === 'length') {
    inductanceH = gappedInductance(gappedCore(geometry, material, primaryTurns), step.gapLengthM);
  }
  const key = String(inductanceH);
  let pass = passes.get(key);
  if (pass === undefined) {
    pass = firstPass(f, inductanceH);
    passes.set(key, pass);
  }
  return pass;
}

/** The first pass with the ideal pass's Lm and the whole-turns ratios `ratios` (cached). */
export function wholeTurnsPass(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  ideal: SolvedPass,
  ratios: number[] | undefined,
): FirstPass {
  if (ratios === undefined) return ideal;
  const inductanceH = ideal.spec.transformer.magnetizingInductanceH;
  const key = `${String(inductanceH)}|${ratios.join(',')}`;
  let pass = passes.get(key);
  if (pass === undefined) {
    pass = firstPass(f, inductanceH, ratios);
    passes.set(key, pass);
  }
  return pass;
}

/**
 * A candidate's two passes: the first pass for gap step `g` (`ideal`) and the pass its whole
 * turns give (`pass`). A gapped core's own whole turns fix its ratios in that first pass (the
 * second pass keeps its Lm, so the first then sees nearly the final operating point). An
 * ungapped core's keeps the ideal ratios: there the topology's own Lm, far below the core's,
 * could make a whole ratio infeasible that the real core can run. Undefined where either solve
 * fails (the converter cannot run).
 */
export function candidatePasses(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  g: number,
  geometry: CoreGeometry,
  material: MaterialClass,
  primaryTurns: number,
): { ideal: SolvedPass; pass: SolvedPass } | undefined {
  const ideal = passFor(f, passes, g, geometry, material, primaryTurns);
  if (!ideal.ok) return undefined;
  const ratios =
    ideal.duty.gapRole === 'set-inductance'
      ? outputTurnsRatiosOf(
          ideal,
          turnsFromPrimary(ideal.idealRatios, primaryTurns),
          f.spec.outputs.length,
        )
      : undefined;
  const pass = wholeTurnsPass(f, passes, ideal, ratios);
  return pass.ok ? { ideal, pass } : undefined;
}

/**
 * The pass the loss and rise bounds are taken on: the converter solved as the second solve will
 * be, but for the winding resistances and leakage (the bounds put the build's own in
 * themselves). For a gapped core that is the candidate's own first pass (its Lm and whole-turns
 * ratios). For an ungapped core the first pass keeps the topology's own Lm, far below the
 * core's, and the ideal ratios, so its magnetizing current, and with it the primary's copper
 * loss, is far above what the build carries; the bound pass takes the Lm the ungapped core
 * gives, the whole-turns ratios, and each winding's least resistance over its wire options at
 * these turns at the ambient (the second solve's are at least that: the build's wire at the
 * hottest corner) and, unless the spec fixes the leakage, {@link BOUND_PASS_LEAKAGE_H} (the
 * spec's leakage as a fraction of Lm would be far above the winding's with the core's Lm, and
 * the duty it loses could put the pass out of reach of a duty the second solve reaches; the
 * bounds scale the leakage-energy loss to the build's own leakage). The push-pull's is solved
 * without leakage instead ({@link PUSH_PULL_BOUND_LEAKAGE_H}). Every topology's with output
 * inductors (all but the flyback) carries their loss evaluated on this pass, never under a proven
 * floor, in place of their assumed copper line (`withInductorFloor`).
 * Undefined when that solve fails (then nothing is bounded). With `only` (operating-corner
 * indices), that pass at those corners only (`firstPass`'s `only`): each corner of it is that
 * corner of the whole pass to the bit, and where it fails the whole pass fails too.
 */
export function boundPassFor(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  pass: SolvedPass,
  ideal: SolvedPass,
  geometry: CoreGeometry,
  material: MaterialClass,
  primaryTurns: number,
  only?: readonly number[],
): SolvedPass | undefined {
  if (pass.duty.gapRole === 'set-inductance') return pass;
  const inductanceH = gappedInductance(gappedCore(geometry, material, primaryTurns), 0);
  const turns = turnsFromPrimary(ideal.idealRatios, primaryTurns);
  const ratios = outputTurnsRatiosOf(ideal, turns, f.spec.outputs.length);
  const leastOhm = f.wireOptions.map(
    (options, k) =>
      turns[k]! *
      geometry.meanTurnLengthM *
      // A foil without a width spans at most the whole breadth: its least resistance.
      Math.min(
        ...options.map(
          (wire) => wireDimensions(wire, geometry.windowBreadthM).resistancePerLengthAt20COhmPerM,
        ),
      ),
  );
  const isPushPull = f.topology.id === 'push-pull';
  const resistances: WindingResistances = {
    leakageH: isPushPull ? PUSH_PULL_BOUND_LEAKAGE_H : BOUND_PASS_LEAKAGE_H,
    primaryAt20COhm: f.spec.transformer.primaryResistanceOhm,
    outputsAt20COhm: f.spec.outputs.map((output) => output.windingResistanceOhm),
  };
  const named = new Set<number>();
  ideal.duty.windings.forEach((winding, k) => {
    if (winding.role.kind === 'primary') resistances.primaryAt20COhm = leastOhm[k]!;
    if (winding.role.kind !== 'output' || named.has(winding.role.outputIndex)) return;
    // The first winding of an output names its resistance, as the design's fixing does.
    named.add(winding.role.outputIndex);
    resistances.outputsAt20COhm[winding.role.outputIndex] = leastOhm[k]!;
  });
  const corners = only === undefined ? '' : `|at ${only.join(',')}`;
  const key = `${String(inductanceH)}|${ratios?.join(',') ?? ''}|${leastOhm.join(',')}${corners}`;
  let bound = passes.get(key);
  if (bound === undefined) {
    bound = firstPass(f, inductanceH, ratios, resistances, only);
    passes.set(key, bound);
  }
  if (!bound.ok) return undefined;
  return withInductorFloor(f, passes, key, bound, pass, material);
}

/**
 * The bound pass with each output inductor's assumed copper line (the spec's
 * inductorResistanceOhm, 10 mΩ by default) replaced by the loss of the inductors every candidate
 * of `material` is evaluated with (`outputInductorsOfMaterial`: designed once on the first pass),
 * evaluated on the bound pass itself (`inductorLossesOn`: copper and core at each corner, the
 * evaluation the final corners take, `cornersWithMagnetics`, on the bound pass's inductor
 * currents), and never less than Rdc(ambient)·Io², Io the output's load current at the corner.
 * The final corners carry that inductor's evaluated loss instead of the assumed line
 * (`cornersWithMagnetics`). So every line of the bound pass is what the evaluation gives on that
 * pass, the inductors' now too, and the step to the second solve (which moves their currents,
 * as it moves every other line's) is what the request's margin covers, as for the rest. The floor:
 * the evaluation's copper Rdc(T)·(Idc² + Σ Fr(n)·In²) at a copper temperature T at least the
 * ambient (the evaluation's winding sits at the ambient plus its rise), plus its core loss (≥ 0);
 * and an output inductor's mean current is the load current (the output capacitor carries no
 * mean current in the steady state: charge balance, Erickson & Maksimović, 2nd ed. (from
 * memory), §2.3), so Idc² = Io². Less a millionth for the solve's tolerance on that mean. It is
 * the bound where the inductors cannot be evaluated on the pass (a winding that no longer fits).
 * Why: on the small push-pull search of `loss-bound-core-search.test.ts` the assumed line was
 * 1.027 W at 36 V and full load where the designed inductor lost 0.388 W (copper and core), so
 * the bound pass's other losses were over the build's by 0.64 W. The forwards and the half and
 * full bridges take the same assumed line for the same inductors, so they take the same term.
 * The floor alone (2026-12-05, before the evaluation) left the whole-catalog two-switch
 * forward's leaf bound about 0.33 W under its probe's (DEVELOPERS.md, "The core search"): the
 * designed inductor's ripple copper, its core and its own rise.
 * The bound pass itself where there are no output inductors (the flyback). Cached per material.
 */
function withInductorFloor(
  f: FrequencySpace,
  passes: Map<string, FirstPass>,
  key: string,
  bound: SolvedPass,
  pass: SolvedPass,
  material: MaterialClass,
): SolvedPass {
  const floorKey = `${key}|inductors of ${material.id}`;
  const known = passes.get(floorKey);
  if (known !== undefined && known.ok) return known;
  const inductors = outputInductorsOfMaterial(pass, material);
  if (inductors.ok && inductors.value.length === 0) return bound;
  const ambientC = f.spec.ambientTemperatureC;
  const evaluatedW = inductors.ok ? inductorLossesOn(bound, inductors.value, ambientC) : undefined;
  const restLossW = bound.restLossW.map((restW, i) => {
    const corner = bound.solved.corners[i]!;
    // Where they cannot be designed every candidate of the material fails its evaluation (its
    // second solve has no inductors), so no bound of it can put an accepted one out.
    if (!inductors.ok) return restW;
    let assumedW = 0;
    let floorW = 0;
    for (const inductor of inductors.value) {
      for (const line of corner.losses) {
        if (line.mechanism === 'copper' && line.component === inductor.duty.name) {
          assumedW += line.powerW;
        }
      }
      const loadA =
        (f.spec.outputs[inductor.duty.outputIndex]?.currentA ?? 0) * corner.loadFraction;
      const resistanceOhm = copperResistance(inductor.evaluation.resistancesAt20COhm[0]!, ambientC);
      floorW += resistanceOhm * loadA * loadA * (1 - 1e-6);
    }
    const exactW = evaluatedW?.[i];
    return (
      Math.max(0, restW - assumedW) + (exactW === undefined ? floorW : Math.max(floorW, exactW))
    );
  });
  const floored: SolvedPass = { ...bound, restLossW };
  passes.set(floorKey, floored);
  return floored;
}

/**
 * Each corner's loss of the output inductors `inductors` evaluated on the bound pass `bound`
 * (copper and core, summed over the inductors; each corner evaluated on its own, as
 * `evaluateTransformer` does, so a pass at some corners gives those corners' numbers), W, as
 * `cornersWithMagnetics` evaluates them on a solve; undefined where one does not fit.
 */
function inductorLossesOn(
  bound: SolvedPass,
  inductors: readonly FixedInductor[],
  ambientC: number,
): number[] | undefined {
  const duties = outputInductorDuties(ambientC, bound.solved);
  const sums: number[] = bound.solved.corners.map(() => 0);
  for (const inductor of inductors) {
    const duty = duties[inductor.duty.outputIndex];
    if (duty === undefined) return undefined;
    const evaluation = evaluateInductor(
      duty,
      inductor.build,
      inductor.settings,
      inductor.isGapFixed,
    );
    if (evaluation === undefined) return undefined;
    evaluation.corners.forEach((corner, i) => {
      sums[i] = sums[i]! + corner.totalLossW;
    });
  }
  return sums;
}

/**
 * The operating corners at the spec's largest load fraction (indices, ascending), where an
 * ungapped core's node is bounded first (`runBlock`); undefined where that is every corner.
 */
export function fullLoadCorners(f: FrequencySpace): number[] | undefined {
  const loads = f.spec.loadFractions;
  const most = Math.max(...loads);
  const corners: number[] = [];
  operatingCorners(f.spec).forEach((corner, c) => {
    if (corner.loadFraction === most) corners.push(c);
  });
  return corners.length < 3 * loads.length ? corners : undefined;
}

/**
 * The corners an ungapped core's node is bounded at before its whole bound pass, stage by stage
 * (`runBlock`), each stage's a superset of the one before: the full-load corner at the highest
 * input (where the converter solve is cheapest: the push-pull's leaky half runs at low input),
 * then every full-load corner. Undefined where full load is every corner.
 */
export function boundPassStages(f: FrequencySpace): number[][] | undefined {
  const full = fullLoadCorners(f);
  if (full === undefined) return undefined;
  return full.length > 1 ? [[full[full.length - 1]!], full] : [full];
}

/**
 * Leakage of an ungapped core's bound pass, H: far below any catalog winding's (tens of nH up).
 * The bounds scale the pass's leakage-energy lines (mechanism 'clamp') by the build's leakage
 * over it: the trade's leakage energy, ½·Llk·I² per turn-off (the RCD clamp's
 * ½·Llk·I²·Vc/(Vc − Vr)·fs; Pressman, Billings, Morey, Switching Power Supply Design, 3rd ed.,
 * from memory), is linear in Llk at the same currents. Not for the push-pull (below).
 */
const BOUND_PASS_LEAKAGE_H = 1e-9;

/**
 * Leakage of the push-pull's bound pass, H: none, and so no leakage-energy term in its bounds
 * (every line the leakage adds is at least zero). Its leakage lines are not ½·Llk·I² at 1 nH
 * scaled linearly (push-pull-clamp.ts): (a) the turn-on ring (the off drain's capacitance C with
 * both halves' leakage, an LC step from the freewheel towards Vin + Vp, common practice) gives
 * the clamp the charge C·(step² − (Vc − Vp)²)/(Vc − Vp) whatever Llk is, so scaled from 1 nH to a
 * 37 nH build it is counted 37 times over; (b) at turn-off the clamp takes only what the ring
 * with the drain capacitance and the winding's fall to the output leave of ½·Llk·I0²; (c) the
 * turn-on ring's current, step·√(C/(2·Llk)) over half of its period π·√(2·Llk·C), adds to each
 * switch and primary half: its crest and its mean square grow as Llk falls (∝ 1/√Llk), and at
 * 1 nH the crest is the switch's peak, which its turn-off overlap loss reads. On the small search
 * of `loss-bound-core-search.test.ts` (build 120, 36.95 nH, at 36 V and full load) the pass at
 * 1 nH gave 0.0287 W of clamp, scaled to 1.06 W where the build's own clamp line is 0.24 W, and
 * 0.491 W of turn-off per switch against the build's 0.335 W: its bound (10.13 W before the
 * margin) was 20 % over the build's 8.449 W, and the default margin put the search's best build
 * out. Without leakage there is no clamp, ring or ring current in the solve; what the build's
 * leakage moves beyond them (its commutation's lost duty) is the second solve's move, which the
 * margin covers as for every topology (measured; the tests compare with exhaustive searches).
 */
const PUSH_PULL_BOUND_LEAKAGE_H = 0;

function gappedCore(geometry: CoreGeometry, material: MaterialClass, turns: number): GappedCore {
  return {
    turns,
    effectiveLengthM: geometry.effectiveLengthM,
    effectiveAreaM2: geometry.effectiveAreaM2,
    relativePermeability: material.initialPermeability,
    windowHeightM: geometry.windowBreadthM,
    fringing: 'mclyman',
  };
}

/**
 * Whether some gap up to half the window height gives `inductanceH` (the conditions of
 * gapLengthForInductance, which the design's evaluation uses to cut the gap).
 */
export function isInductanceReachable(
  geometry: CoreGeometry,
  material: MaterialClass,
  turns: number,
  inductanceH: number,
): boolean {
  const core = gappedCore(geometry, material, turns);
  return (
    inductanceH < gappedInductance(core, 0) &&
    gappedInductance(core, 0.5 * geometry.windowBreadthM) <= inductanceH
  );
}
