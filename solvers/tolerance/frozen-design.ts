import { cornerWithTransformer } from '../design/corner-with-transformer.js';
import type { AnyCorner, Design } from '../design/design-schema.js';
import type { FixedInductor } from '../design/inductor-pass.js';
import { fixMagnetics } from '../design/magnetics-pass.js';
import {
  solveEveryCorner,
  type AnyTopology,
  type FixedTransformer,
} from '../design/transformer-pass.js';
import { evaluateInductor } from '../inductor/design-inductor.js';
import { inductorWindingDuty, outputInductorDuties } from '../inductor/inductor-duty.js';
import { success, type Issue, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import {
  evaluateTransformer,
  type TransformerCorner,
} from '../transformer/evaluate-transformer.js';
import type { MagnetizingInductanceBasis } from './tolerance-parameters.js';

/**
 * A converter designed once and then built: every choice the engine made is frozen.
 *
 * How a frozen design is evaluated with perturbed parts, through the engine's own exports:
 * `freezeDesign` runs the steps of `designConverter` (solve every corner, design the transformer
 * and each output inductor, fix them into the spec: whole-turns ratios, winding resistances,
 * leakage, the winding temperature, each inductor's resistance) and then writes every remaining choice into the spec field that pins
 * it (turnsRatio, outputTurnsRatios, magnetizingInductanceH, leakageInductanceH, the flyback's
 * clamp.voltageV (and a push-pull's with leakage), each outputs[k].inductanceH, forward.resetTurnsRatio,
 * activeClamp.capacitanceF). A topology's `choose` keeps every value its spec fixes, so on a unit's
 * spec (the pinned spec with the unit's part values written in) it re-derives only what follows
 * from the parts (winding resistances at temperature), never the turns: a built unit does not
 * re-choose its turns. `designConverter` itself is not called because it returns the design
 * but not the `FixedTransformer` and `FixedInductor`s (core, turns, wires) each unit's magnetics
 * are re-evaluated with; tests check that the nominal unit reproduces the design's corner.
 */
export interface FrozenDesign {
  topology: AnyTopology;
  /** The spec with the transformer fixed in and every choice pinned in its fields. */
  spec: Spec;
  /** The choices the design made (as the pinned spec reproduces them). */
  choices: Design['choices'];
  /** The wound transformer, when the spec asks the engine to design it. */
  transformer?: FixedTransformer;
  /** Each output inductor as wound (a buck-derived topology that designs its magnetics). */
  inductors: readonly FixedInductor[];
  /** How Lm is set, for its default spread. */
  magnetizingInductance: MagnetizingInductanceBasis;
}

/**
 * Designs `spec` once and freezes the design; the engine's issues when the nominal design is
 * infeasible at any corner (with the designed transformer, when there is one).
 */
export function freezeDesign(spec: Spec): Result<FrozenDesign> {
  const topology = topologyById(spec.topology);
  const first = solveEveryCorner(topology, spec);
  if (!first.ok) return first;
  const fixed = fixMagnetics(topology, spec, first.value);
  if (!fixed.ok) return fixed;
  const withMagnetics = fixed.value?.spec ?? spec;
  const transformer = fixed.value?.transformer;
  const chosen = topology.choose(withMagnetics);
  if (!chosen.ok) return chosen;
  const pinned = pinChoices(withMagnetics, chosen.value);
  // The design is feasible at every corner only if the pinned spec is (as designConverter checks).
  const check = solveEveryCorner(topology, pinned);
  if (!check.ok) return check;
  const gapRole =
    transformer?.gapRole ??
    topology.transformerDuty?.(pinned, check.value.choices, check.value.corners).gapRole;
  return success({
    topology,
    spec: pinned,
    choices: check.value.choices,
    ...(transformer === undefined ? {} : { transformer }),
    inductors: fixed.value?.inductors ?? [],
    magnetizingInductance: {
      gapRole,
      permeabilityTolerance: transformer?.build.material.initialPermeabilityTolerance,
    },
  });
}

/** `spec` with every choice of `choices` written into the field that fixes it. */
function pinChoices(spec: Spec, choices: Design['choices']): Spec {
  const pinned: Spec = {
    ...spec,
    transformer: {
      ...spec.transformer,
      turnsRatio: choices.turnsRatio,
      outputTurnsRatios: [...choices.outputTurnsRatios],
      magnetizingInductanceH: choices.magnetizingInductanceH,
      leakageInductanceH: choices.leakageInductanceH,
    },
  };
  if ('clampVoltageV' in choices) pinned.clamp = { ...spec.clamp, voltageV: choices.clampVoltageV };
  if ('outputInductancesH' in choices) {
    pinned.outputs = spec.outputs.map((output, k) => ({
      ...output,
      inductanceH: choices.outputInductancesH[k] ?? output.inductanceH,
    }));
  }
  if ('resetTurnsRatio' in choices) {
    pinned.forward = { ...spec.forward, resetTurnsRatio: choices.resetTurnsRatio };
  }
  if ('clampCapacitanceF' in choices) {
    pinned.activeClamp = {
      ...spec.activeClamp,
      capacitanceF: choices.clampCapacitanceF,
      capacitorEsrOhm: choices.clampCapacitorEsrOhm,
    };
  }
  return pinned;
}

/** A voltage rating no solved stress reaches: ratings are checked by the tolerance run itself. */
const UNCHECKED_RATING_V = 1e12;

/**
 * A unit's spec as the topology solves it: every voltage rating lifted out of reach, so that a
 * unit over its rating is still solved and its stress counted against the rating by the run
 * (the engine would otherwise refuse the corner), and no hold-up block (a design-level sizing).
 */
export function solvableUnitSpec(spec: Spec): Spec {
  const { holdUp: _holdUp, ...rest } = spec;
  return {
    ...rest,
    primarySwitch: { ...spec.primarySwitch, voltageRatingV: UNCHECKED_RATING_V },
    outputs: spec.outputs.map((output) => {
      const { voltageRatingV: _rating, ...rectifier } = output.rectifier;
      return { ...output, rectifier };
    }),
    ...(spec.activeClamp?.auxiliarySwitch === undefined
      ? {}
      : {
          activeClamp: {
            ...spec.activeClamp,
            auxiliarySwitch: {
              ...spec.activeClamp.auxiliarySwitch,
              voltageRatingV: UNCHECKED_RATING_V,
            },
          },
        }),
  };
}

/** One built unit at its operating point: solved, or the engine's reasons why not. */
export type UnitOutcome =
  | {
      solved: true;
      corner: AnyCorner;
      transformer?: TransformerCorner;
      /** Each wound output inductor at the unit, in the frozen design's order. */
      inductors?: TransformerCorner[];
    }
  | { solved: false; issues: Issue[] };

/**
 * Solves one unit: `unitSpec` is the pinned spec with the unit's part values and operating
 * point written in (its three input voltages equal, its currents those of its load); the
 * topology re-derives only the part-dependent values, the corner is solved at that input and
 * full load of those currents, and a designed transformer and each wound output inductor are
 * re-evaluated on it (flux, losses, temperature) and their losses added, as `designConverter`
 * adds them (transformer first).
 */
export function solveUnit(frozen: FrozenDesign, unitSpec: Spec): UnitOutcome {
  const spec = solvableUnitSpec(unitSpec);
  const { topology } = frozen;
  const chosen = topology.choose(spec);
  if (!chosen.ok) return { solved: false, issues: chosen.issues };
  const solved = topology.solveCorner(spec, chosen.value, {
    label: 'unit',
    inputVoltageV: spec.inputVoltageNominalV,
    loadFraction: 1,
  });
  if (!solved.ok) return { solved: false, issues: solved.issues };
  let corner: AnyCorner = solved.value;
  let transformer: TransformerCorner | undefined;
  const fixed = frozen.transformer;
  if (fixed !== undefined && topology.transformerDuty !== undefined) {
    // The gap role is the design's: a gap cut for Lm stays cut for it (fixTransformer's choice).
    const duty = {
      ...topology.transformerDuty(spec, chosen.value, [solved.value]),
      gapRole: fixed.gapRole,
    };
    transformer = evaluateTransformer(duty, fixed.build, fixed.settings)?.corners[0];
    if (transformer === undefined) {
      return unsolvable(['transformer', 'magnetizingInductanceH'], duty.magnetizingInductanceH);
    }
    corner = cornerWithTransformer(corner, duty, transformer);
  }
  if (frozen.inductors.length === 0) {
    return { solved: true, corner, ...(transformer === undefined ? {} : { transformer }) };
  }
  // The inductors' duties come from the solved waveforms (losses added later do not move them).
  const duties = outputInductorDuties(spec.ambientTemperatureC, {
    choices: chosen.value,
    corners: [solved.value],
  });
  const inductors: TransformerCorner[] = [];
  for (const inductor of frozen.inductors) {
    const k = inductor.duty.outputIndex;
    const duty = duties[k];
    const evaluated =
      duty === undefined
        ? undefined
        : evaluateInductor(duty, inductor.build, inductor.settings, inductor.isGapFixed)
            ?.corners[0];
    if (duty === undefined || evaluated === undefined) {
      return unsolvable(['outputs', k, 'inductanceH'], duty?.inductanceH ?? 0);
    }
    inductors.push(evaluated);
    corner = cornerWithTransformer(
      corner,
      inductorWindingDuty(duty, inductor.isGapFixed),
      evaluated,
      duty.name,
    );
  }
  return {
    solved: true,
    corner,
    ...(transformer === undefined ? {} : { transformer }),
    inductors,
  };
}

/** A unit whose wound core cannot give the inductance at `path` (required, H) with its gap. */
function unsolvable(path: (string | number)[], requiredH: number): UnitOutcome {
  return {
    solved: false,
    issues: [
      {
        code: 'non_physical_value',
        path,
        constraint: 'the gap of the wound core can give the inductance',
        quantity: path[path.length - 1] as string,
        required: requiredH,
        limit: 0,
        corner: 'unit',
      },
    ],
  };
}
