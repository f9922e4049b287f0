import type { CoreShape } from '../magnetics/core-shape.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { failure, success, type Issue, type Result } from '../result.js';
import { designTransformer } from '../transformer/design-transformer.js';
import {
  evaluateTransformer,
  type TransformerEvaluation,
} from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import {
  TRANSFORMER_EVALUATION_DEFAULTS,
  type TransformerEvaluationOptions,
} from '../transformer/transformer-evaluation-options.js';
import { transformerIssues } from '../transformer/transformer-issues.js';
import {
  windingWireChoice,
  type WindingWireChoiceOptions,
} from '../transformer/winding-wire-choice.js';
import { repetitionFrequencyHz } from '../waveform/repetition-frequency.js';
import { rms } from '../waveform/rms.js';
import type { WindingWire } from '../transformer/winding-wire.js';
import { inductorWindingDuty, type InductorDuty } from './inductor-duty.js';

/** What an output inductor's design may choose from, and the limits it is held to. */
export interface InductorRequest {
  /** Core shapes to choose from; rings are left out (a ring takes no cut gap). */
  shapes: readonly CoreShape[];
  /** Materials to choose from; at a given core the build with the least loss is taken. */
  materials: readonly MaterialClass[];
  /** Turns, when fixed; else the fewest that keep B in bounds and two more. */
  turns?: number;
  /** The winding's conductor, when fixed; else sized by wireChoice. */
  wire?: WindingWire;
  wireChoice?: WindingWireChoiceOptions;
  evaluation?: TransformerEvaluationOptions;
  /** Where the issues point: outputs[k].inductanceH unless the spec entry fixing the build. */
  issuePath?: readonly (string | number)[];
}

/** The chosen inductor and its evaluation at every corner of its duty. */
export interface InductorChoice {
  build: TransformerBuild;
  evaluation: TransformerEvaluation;
}

/**
 * Designs one output inductor for `duty`, by the transformer's search on a one-winding duty:
 * over the shapes from the smallest effective volume up (rings excluded) and the materials, the
 * fewest whole turns that keep B = L·Ipk/(N·Amin) under fluxDensityUtilizationMax·Bsat at
 * ambient + temperatureRiseMaxK and let the ungapped core exceed the inductance, and two more;
 * the wire from the largest RMS current's density and the skin depth at the ripple's repetition
 * frequency (round, parallel or litz); the gap cut for the inductance with McLyman's fringing factor; one layer
 * stack on the centre leg; losses (iGSE over L·i(t)/(N·Ae), DC plus Dowell per ripple harmonic)
 * and temperature iterated as the transformer's. The first shape with a build inside every
 * limit wins. Issues with numbers, at outputs[k].inductanceH, when none fits.
 */
export function designInductor(
  duty: InductorDuty,
  request: InductorRequest,
): Result<InductorChoice> {
  // The wire is sized at the ripple's own frequency (twice fs behind a double-ended stage).
  const rmsA = Math.max(...duty.currentsA.map((current) => rms(current)), 1e-6);
  const frequencyHz = Math.max(...duty.currentsA.map((current) => repetitionFrequencyHz(current)));
  const chosen = designTransformer(inductorWindingDuty(duty), {
    shapes: request.shapes.filter((shape) => shape.family !== 'ring'),
    materials: request.materials,
    arrangement: 'stacked',
    wires: [request.wire ?? windingWireChoice(rmsA, frequencyHz, request.wireChoice)],
    ...(request.turns === undefined ? {} : { primaryTurns: request.turns }),
    ...(request.evaluation === undefined ? {} : { evaluation: request.evaluation }),
  });
  if (!chosen.ok) {
    return failure(chosen.issues.map((issue) => asInductorIssue(duty, issue, request.issuePath)));
  }
  return success({ build: chosen.value.build, evaluation: chosen.value.evaluation });
}

/**
 * Evaluates a designed inductor on `duty` (corners solved again, say); the gap is cut again for
 * the duty's inductance. Undefined when the winding no longer fits or the gap cannot give it.
 */
export function evaluateInductor(
  duty: InductorDuty,
  build: TransformerBuild,
  options: TransformerEvaluationOptions = {},
  isGapFixed = false,
): TransformerEvaluation | undefined {
  return evaluateTransformer(inductorWindingDuty(duty, isGapFixed), build, options);
}

/**
 * Returns the limits an evaluated inductor breaks (window fill, flux density against saturation
 * at each corner's temperature, temperature rise), as issues at outputs[k].inductanceH.
 */
export function inductorIssues(
  duty: InductorDuty,
  evaluation: TransformerEvaluation,
  options: TransformerEvaluationOptions = {},
  path?: readonly (string | number)[],
): Issue[] {
  const settings = { ...TRANSFORMER_EVALUATION_DEFAULTS, ...options };
  return transformerIssues(evaluation, settings).map((issue) => asInductorIssue(duty, issue, path));
}

/**
 * A wound-core issue restated for output inductor `duty`: its quantity and constraint, and its
 * path (outputs[k].inductanceH unless `path` names the spec entry that fixes the build).
 */
export function asInductorIssue(
  duty: InductorDuty,
  issue: Issue,
  path: readonly (string | number)[] = ['outputs', duty.outputIndex, 'inductanceH'],
): Issue {
  const rename = (text: string) => text.replaceAll('magnetizingInductanceH', 'inductanceH');
  return {
    ...issue,
    path: [...path],
    quantity: rename(issue.quantity),
    constraint: `${duty.name}: ${rename(issue.constraint)}`,
  };
}
